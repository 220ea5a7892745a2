import { zipSync } from "fflate";
import { XMLBuilder } from "fast-xml-parser";
import type { BcfCamera, BcfFile, BcfTopic, BcfViewpoint, Vec3 } from "./types";

const builder = new XMLBuilder({ ignoreAttributes: false, attributeNamePrefix: "@_", format: true, suppressEmptyNode: true });
const xml = (root: Record<string, unknown>) => `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n${builder.build(root)}`;
const encode = (text: string) => new TextEncoder().encode(text);
const xyz = ([X, Y, Z]: Vec3) => ({ X, Y, Z });
// Element order follows the XSD sequences: the builder keeps key order, and absent keys write nothing.
const present = <T extends Record<string, unknown>>(o: T) => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined && !(Array.isArray(v) && v.length === 0)));

function cameraXml(camera: BcfCamera) {
  const base = { CameraViewPoint: xyz(camera.position), CameraDirection: xyz(camera.direction), CameraUpVector: xyz(camera.up) };
  return camera.kind === "perspective"
    ? { PerspectiveCamera: { ...base, FieldOfView: camera.fieldOfView, AspectRatio: camera.aspectRatio } }
    : { OrthogonalCamera: { ...base, ViewToWorldScale: camera.viewToWorldScale, AspectRatio: camera.aspectRatio } };
}

/** visinfo.xsd: components (selection), camera, clipping planes. */
export function viewpointXml(v: BcfViewpoint): string {
  return xml({
    VisualizationInfo: {
      "@_Guid": v.guid,
      ...(v.selection.length > 0 ? { Components: { Selection: { Component: v.selection.map((g) => ({ "@_IfcGuid": g })) } } } : {}),
      // A viewpoint without a camera gets a neutral one: the schema requires a camera.
      ...cameraXml(v.camera ?? { kind: "perspective", position: [0, 0, 10], direction: [0, 0, -1], up: [0, 1, 0], fieldOfView: 60, aspectRatio: 1 }),
      ...(v.clippingPlanes.length > 0 ? { ClippingPlanes: { ClippingPlane: v.clippingPlanes.map((p) => ({ Location: xyz(p.location), Direction: xyz(p.direction) })) } } : {}),
    },
  });
}

const viewpointFile = (v: BcfViewpoint) => `viewpoint-${v.guid}.bcfv`;
const snapshotFile = (v: BcfViewpoint) => `snapshot-${v.guid}.png`;

/** markup.xsd: one topic with its comments and viewpoint references. */
export function markupXml(t: BcfTopic): string {
  return xml({
    Markup: {
      Topic: {
        "@_Guid": t.guid,
        "@_TopicType": t.type,
        "@_TopicStatus": t.status,
        ...present({
          Title: t.title,
          Labels: t.labels.length > 0 ? { Label: t.labels } : undefined,
          CreationDate: t.creationDate,
          CreationAuthor: t.creationAuthor,
          ModifiedDate: t.modifiedDate,
          DueDate: t.dueDate,
          AssignedTo: t.assignedTo,
          Description: t.description?.trim() ? t.description : undefined,
          Comments:
            t.comments.length > 0
              ? {
                  Comment: t.comments.map((c) => ({
                    "@_Guid": c.guid,
                    ...present({ Date: c.date, Author: c.author, Comment: c.text.trim() ? c.text : undefined, Viewpoint: c.viewpointGuid ? { "@_Guid": c.viewpointGuid } : undefined }),
                  })),
                }
              : undefined,
          Viewpoints:
            t.viewpoints.length > 0
              ? { ViewPoint: t.viewpoints.map((v) => ({ "@_Guid": v.guid, Viewpoint: viewpointFile(v), ...(v.snapshot ? { Snapshot: snapshotFile(v) } : {}) })) }
              : undefined,
        }),
      },
    },
  });
}

/** extensions.xml: the topic types, statuses, labels and users the topics use. */
export function extensionsXml(file: BcfFile, statuses: string[]): string {
  const unique = (values: (string | undefined)[]) => [...new Set(values.filter((v): v is string => !!v && v.trim() !== ""))];
  return xml({
    Extensions: present({
      TopicTypes: { TopicType: unique(file.topics.map((t) => t.type)) },
      TopicStatuses: { TopicStatus: unique([...statuses, ...file.topics.map((t) => t.status)]) },
      TopicLabels: { TopicLabel: unique(file.topics.flatMap((t) => t.labels)) },
      Users: { User: unique(file.topics.flatMap((t) => [t.creationAuthor, t.assignedTo, ...t.comments.map((c) => c.author)])) },
    }),
  });
}

/** The XML files of a BCF 3.0 archive by path (what `writeBcf` zips; the tests validate each against the XSDs). */
export function bcfEntries(file: BcfFile, statuses: string[]): Record<string, string> {
  const entries: Record<string, string> = {
    "bcf.version": xml({ Version: { "@_VersionId": "3.0" } }),
    "extensions.xml": extensionsXml(file, statuses),
  };
  if (file.project) entries["project.bcfp"] = xml({ ProjectInfo: { Project: { "@_ProjectId": file.project.id, Name: file.project.name } } });
  for (const t of file.topics) {
    entries[`${t.guid}/markup.bcf`] = markupXml(t);
    for (const v of t.viewpoints) entries[`${t.guid}/${viewpointFile(v)}`] = viewpointXml(v);
  }
  return entries;
}

/** A BCF 3.0 archive (zip) of the topics, with viewpoints and PNG snapshots. */
export function writeBcf(file: BcfFile, statuses: string[]): Uint8Array {
  const files: Record<string, Uint8Array> = {};
  for (const [path, text] of Object.entries(bcfEntries(file, statuses))) files[path] = encode(text);
  for (const t of file.topics) for (const v of t.viewpoints) if (v.snapshot) files[`${t.guid}/${snapshotFile(v)}`] = v.snapshot;
  return zipSync(files);
}

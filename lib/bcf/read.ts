import { unzipSync } from "fflate";
import { XMLParser } from "fast-xml-parser";
import { BCF_GUID, type BcfCamera, type BcfComment, type BcfFile, type BcfProblem, type BcfTopic, type BcfViewpoint, type Vec3 } from "./types";

/** Limits for an uploaded archive: a hostile zip must not fill memory (a zip bomb is refused before inflating). */
export const BCF_LIMITS = { archiveBytes: 50 * 1024 * 1024, entryBytes: 20 * 1024 * 1024, totalBytes: 200 * 1024 * 1024, entries: 5000 } as const;

const lists = new Set(["Topic", "Comment", "ViewPoint", "Label", "Component", "ClippingPlane", "File", "TopicStatus", "TopicType"]);
const parser = new XMLParser({
  ignoreAttributes: false,
  attributeNamePrefix: "@_",
  parseTagValue: false,
  parseAttributeValue: false,
  trimValues: true,
  removeNSPrefix: true,
  isArray: (name) => lists.has(name),
});

type Node = Record<string, unknown>;
const str = (v: unknown): string | undefined => (typeof v === "string" ? v : v && typeof v === "object" && typeof (v as Node)["#text"] === "string" ? ((v as Node)["#text"] as string) : undefined);
const node = (v: unknown): Node | undefined => (v && typeof v === "object" && !Array.isArray(v) ? (v as Node) : undefined);
const arr = (v: unknown): Node[] => (Array.isArray(v) ? v.map((x) => node(x) ?? {}) : []);

function parseXml(text: string, where: string, problems: BcfProblem[]): Node | undefined {
  // BCF never needs a DTD; refusing one shuts out entity-expansion attacks.
  if (/<!DOCTYPE/i.test(text)) {
    problems.push({ where, message: "XML with a DOCTYPE is refused" });
    return undefined;
  }
  try {
    return parser.parse(text) as Node;
  } catch (error) {
    problems.push({ where, message: `not well-formed XML: ${(error as Error).message}` });
    return undefined;
  }
}

function vec(v: unknown): Vec3 | undefined {
  const n = node(v);
  const xs = [n?.X, n?.Y, n?.Z].map((c) => Number(str(c)));
  return xs.every(Number.isFinite) ? (xs as Vec3) : undefined;
}

function readCamera(info: Node): BcfCamera | undefined {
  const p = node(info.PerspectiveCamera);
  const o = node(info.OrthogonalCamera);
  const c = p ?? o;
  if (!c) return undefined;
  const position = vec(c.CameraViewPoint);
  const direction = vec(c.CameraDirection);
  const up = vec(c.CameraUpVector);
  const aspectRatio = Number(str(c.AspectRatio) ?? 1);
  if (!position || !direction || !up) return undefined;
  if (p) return { kind: "perspective", position, direction, up, fieldOfView: Number(str(p.FieldOfView) ?? 60), aspectRatio };
  return { kind: "orthogonal", position, direction, up, viewToWorldScale: Number(str(o!.ViewToWorldScale) ?? 1), aspectRatio };
}

function readViewpoint(guid: string, text: string | undefined, snapshot: Uint8Array | undefined, where: string, problems: BcfProblem[]): BcfViewpoint {
  const viewpoint: BcfViewpoint = { guid, selection: [], clippingPlanes: [], snapshot };
  if (text === undefined) return viewpoint;
  const info = node(parseXml(text, where, problems)?.VisualizationInfo);
  if (!info) return viewpoint;
  viewpoint.camera = readCamera(info);
  viewpoint.selection = arr(node(node(info.Components)?.Selection)?.Component)
    .map((c) => str(c["@_IfcGuid"]))
    .filter((g): g is string => g !== undefined);
  viewpoint.clippingPlanes = arr(node(info.ClippingPlanes)?.ClippingPlane).flatMap((p) => {
    const location = vec(p.Location);
    const direction = vec(p.Direction);
    return location && direction ? [{ location, direction }] : [];
  });
  return viewpoint;
}

const isPng = (bytes: Uint8Array | undefined) => bytes !== undefined && bytes.length > 8 && bytes[0] === 0x89 && bytes[1] === 0x50 && bytes[2] === 0x4e && bytes[3] === 0x47;

/** Reads a BCF archive (3.0; 2.1 markup reads the same way for what we use); every problem is listed. */
export function readBcf(bytes: Uint8Array): { file?: BcfFile; problems: BcfProblem[] } {
  const problems: BcfProblem[] = [];
  if (bytes.byteLength > BCF_LIMITS.archiveBytes) return { problems: [{ where: "archive", message: `larger than ${BCF_LIMITS.archiveBytes / 1024 / 1024} MB` }] };
  let entries: Record<string, Uint8Array>;
  let total = 0;
  let count = 0;
  try {
    entries = unzipSync(bytes, {
      filter: (f) => {
        count += 1;
        total += f.originalSize;
        if (count > BCF_LIMITS.entries || f.originalSize > BCF_LIMITS.entryBytes || total > BCF_LIMITS.totalBytes) throw new Error(`entry ${f.name} goes over the archive limits`);
        return !f.name.endsWith("/");
      },
    });
  } catch (error) {
    return { problems: [{ where: "archive", message: `not a readable BCF zip archive: ${(error as Error).message}` }] };
  }
  const text = (path: string) => (entries[path] ? new TextDecoder().decode(entries[path]).replace(/^\uFEFF/, "") : undefined);
  const versionXml = text("bcf.version");
  const version = versionXml ? str(node(parseXml(versionXml, "bcf.version", problems)?.Version)?.["@_VersionId"]) : undefined;
  if (!version) problems.push({ where: "bcf.version", message: "missing or without a VersionId" });
  const projectXml = text("project.bcfp");
  const projectNode = projectXml ? node(node(parseXml(projectXml, "project.bcfp", problems)?.ProjectInfo)?.Project) : undefined;
  const project = projectNode ? { id: str(projectNode["@_ProjectId"]) ?? "", name: str(projectNode.Name) ?? "" } : undefined;

  const topics: BcfTopic[] = [];
  const markups = Object.keys(entries).filter((p) => /^[^/]+\/markup\.bcf$/.test(p)).sort();
  if (markups.length === 0) problems.push({ where: "archive", message: "no topic folder with a markup.bcf" });
  for (const path of markups) {
    const folder = path.slice(0, path.indexOf("/"));
    const markup = node(parseXml(text(path)!, path, problems)?.Markup);
    const topicNode = arr(markup?.Topic)[0];
    if (!topicNode) {
      problems.push({ where: path, message: "no Topic element" });
      continue;
    }
    const guid = str(topicNode["@_Guid"])?.toLowerCase() ?? "";
    const title = str(topicNode.Title) ?? "";
    if (!BCF_GUID.test(guid)) problems.push({ where: path, message: `topic Guid "${guid}" is not a GUID` });
    if (title.trim() === "") problems.push({ where: path, message: "the topic has no Title" });
    if (!BCF_GUID.test(guid) || title.trim() === "") continue;
    const viewpoints = arr(node(topicNode.Viewpoints)?.ViewPoint).map((v) => {
      const vGuid = str(v["@_Guid"])?.toLowerCase() ?? "";
      const vFile = str(v.Viewpoint);
      const sFile = str(v.Snapshot);
      const snapshot = sFile ? entries[`${folder}/${sFile}`] : undefined;
      if (sFile && !isPng(snapshot)) problems.push({ where: `${folder}/${sFile}`, message: snapshot ? "the snapshot is not a PNG image" : "the snapshot file is missing" });
      return readViewpoint(vGuid, vFile ? text(`${folder}/${vFile}`) : undefined, isPng(snapshot) ? snapshot : undefined, `${folder}/${vFile}`, problems);
    });
    const comments: BcfComment[] = arr(node(topicNode.Comments)?.Comment).map((c) => ({
      guid: str(c["@_Guid"])?.toLowerCase() ?? "",
      date: str(c.Date) ?? "",
      author: str(c.Author) ?? "",
      // "Comment" is both the comment element and its text element; the list option makes the inner one a list too.
      text: str(Array.isArray(c.Comment) ? c.Comment[0] : c.Comment) ?? "",
      viewpointGuid: str(node(c.Viewpoint)?.["@_Guid"])?.toLowerCase(),
    }));
    for (const c of comments) if (!BCF_GUID.test(c.guid)) problems.push({ where: path, message: `comment Guid "${c.guid}" is not a GUID` });
    topics.push({
      guid,
      title,
      status: str(topicNode["@_TopicStatus"]) ?? "",
      type: str(topicNode["@_TopicType"]) ?? "",
      creationDate: str(topicNode.CreationDate) ?? "",
      creationAuthor: str(topicNode.CreationAuthor) ?? "",
      modifiedDate: str(topicNode.ModifiedDate),
      dueDate: str(topicNode.DueDate),
      assignedTo: str(topicNode.AssignedTo),
      description: str(topicNode.Description),
      labels: (Array.isArray(node(topicNode.Labels)?.Label) ? (node(topicNode.Labels)!.Label as unknown[]) : []).map(str).filter((l): l is string => !!l),
      comments: comments.filter((c) => BCF_GUID.test(c.guid)),
      viewpoints,
    });
  }
  return { file: version ? { version, project, topics } : undefined, problems };
}

/** What `npm run -s bcf -- inspect` prints: per topic its guid, title, status, type and counts. */
export function inspectBcf(file: BcfFile) {
  return {
    version: file.version,
    topics: file.topics.map((t) => ({ guid: t.guid, title: t.title, status: t.status, type: t.type, comments: t.comments.length, viewpoints: t.viewpoints.length })),
  };
}

import type { Discipline, PinState } from "@/lib/realtime/events";
import { TOPIC_STATUSES, TOPIC_TYPES } from "./pins";
import type { BcfFile, BcfTopic } from "./types";
import type { Viewpoint } from "@/lib/realtime/viewpoint";
import { toBcfViewpoint } from "./viewpoint";

/** A pin as the BCF export needs it (plain data; the route reads it from the database). */
export interface PinForBcf {
  id: string;
  bcfGuid: string | null;
  title: string;
  state: PinState;
  discipline: Discipline;
  authorEmail: string;
  createdAt: Date;
  updatedAt: Date;
  labels: string[];
  assignedTo: string | null;
  dueAt: Date | null;
  anchor: string;
  viewpoint: Viewpoint | null;
  /** The saved view's snapshot PNG, read from object storage. */
  snapshot?: Uint8Array;
  comments: { id: string; bcfGuid: string | null; body: string; authorEmail: string; externalAuthor: string | null; createdAt: Date; viewpoint: Viewpoint | null }[];
}

/** A viewpoint GUID made from the GUID of what it belongs to with its first group changed, so a re-export keeps it. */
const derivedGuid = (guid: string, digit: string) => `${digit.repeat(8)}${guid.slice(8)}`;

/**
 * The topics of a BCF export: one per pin (GUID = the pin's BCF GUID when it came from BCF, else its id), each
 * comment a comment. The pin's saved view is a viewpoint referenced by the first comment; a comment written with a
 * view gets a viewpoint of its own, which it references instead (markup.xsd: a comment names one viewpoint).
 */
export function bcfFromPins(project: { id: string; name: string }, pins: PinForBcf[], globalIdOf: (memberId: string) => string): BcfFile {
  const topics: BcfTopic[] = pins.map((pin) => {
    const guid = pin.bcfGuid ?? pin.id;
    const viewpointGuid = derivedGuid(guid, "f");
    const pinViewpoints = pin.viewpoint ? [{ ...toBcfViewpoint(viewpointGuid, pin.viewpoint, globalIdOf), ...(pin.snapshot ? { snapshot: pin.snapshot } : {}) }] : [];
    const commentGuid = (c: PinForBcf["comments"][number]) => c.bcfGuid ?? c.id;
    const commentViewpoints = pin.comments.flatMap((c) => (c.viewpoint ? [toBcfViewpoint(derivedGuid(commentGuid(c), "e"), c.viewpoint, globalIdOf)] : []));
    return {
      guid,
      title: pin.title,
      status: TOPIC_STATUSES[pin.state],
      type: TOPIC_TYPES[pin.discipline],
      creationDate: pin.createdAt.toISOString(),
      creationAuthor: pin.authorEmail,
      modifiedDate: pin.updatedAt.toISOString(),
      dueDate: pin.dueAt?.toISOString(),
      assignedTo: pin.assignedTo ?? undefined,
      description: `Anchored on ${pin.anchor}.`,
      labels: pin.labels,
      comments: pin.comments.map((c, k) => ({
        guid: commentGuid(c),
        date: c.createdAt.toISOString(),
        author: c.externalAuthor ?? c.authorEmail,
        text: c.body,
        viewpointGuid: c.viewpoint ? derivedGuid(commentGuid(c), "e") : k === 0 && pinViewpoints.length > 0 ? viewpointGuid : undefined,
      })),
      viewpoints: [...pinViewpoints, ...commentViewpoints],
    };
  });
  return { version: "3.0", project: { id: project.id, name: project.name }, topics };
}

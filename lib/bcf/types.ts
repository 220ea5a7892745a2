/** BCF 3.0 content as plain data (buildingSMART BCF-XML); dates are ISO 8601 strings. */

export type Vec3 = [number, number, number];

export type BcfCamera =
  | { kind: "perspective"; position: Vec3; direction: Vec3; up: Vec3; fieldOfView: number; aspectRatio: number }
  | { kind: "orthogonal"; position: Vec3; direction: Vec3; up: Vec3; viewToWorldScale: number; aspectRatio: number };

export interface BcfClippingPlane {
  location: Vec3;
  direction: Vec3;
}

export interface BcfViewpoint {
  guid: string;
  camera?: BcfCamera;
  /** IFC GlobalIds of the selected components. */
  selection: string[];
  clippingPlanes: BcfClippingPlane[];
  /** PNG bytes of the snapshot, when there is one. */
  snapshot?: Uint8Array;
}

export interface BcfComment {
  guid: string;
  date: string;
  author: string;
  text: string;
  viewpointGuid?: string;
}

export interface BcfTopic {
  guid: string;
  title: string;
  status: string;
  type: string;
  creationDate: string;
  creationAuthor: string;
  modifiedDate?: string;
  dueDate?: string;
  assignedTo?: string;
  description?: string;
  labels: string[];
  comments: BcfComment[];
  viewpoints: BcfViewpoint[];
}

export interface BcfProject {
  id: string;
  name: string;
}

export interface BcfFile {
  version: string;
  project?: BcfProject;
  topics: BcfTopic[];
}

/** A problem found while reading a BCF archive: the entry (or "archive") and why. */
export interface BcfProblem {
  where: string;
  message: string;
}

/** BCF GUIDs are lower-case UUIDs (shared-types.xsd). */
export const BCF_GUID = /^[a-f0-9]{8}-[a-f0-9]{4}-[a-f0-9]{4}-[a-f0-9]{4}-[a-f0-9]{12}$/;

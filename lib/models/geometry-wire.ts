// A revision's geometry as the viewer draws it (issue 13, bytes before the first drawn roof): node coordinates,
// member end indices, a member kind code and a section index per member, then the ids as one small JSON block.
// Sent once per revision (immutable, cacheable) instead of the whole model JSON; the full model is fetched only
// when a browser what-if needs it. Our own small binary layout beside lib/models/result-columns.ts (no package
// packs a few typed arrays with less ceremony). Pure: no I/O.
import { classifyMembers, type MemberClass } from "@/lib/analysis/classify";
import type { TrussModel } from "@/lib/analysis/model";

/** Member kind codes: the index in this list (lib/analysis/classify.ts classes). */
export const MEMBER_KIND_CODES: readonly MemberClass[] = ["top_chord", "bottom_chord", "diagonal", "other"];

/** The unpacked geometry: typed arrays in model order plus the ids they stand for. */
export type WireGeometry = {
  /** [x0, y0, z0, x1, …] in model node order. */
  coordinates: Float32Array;
  /** [i0, j0, i1, j1, …]: node indices of each member's ends. */
  ends: Uint32Array;
  /** MEMBER_KIND_CODES index per member. */
  kinds: Uint8Array;
  /** Index into sectionIds per member. */
  sections: Uint32Array;
  nodeIds: string[];
  memberIds: string[];
  sectionIds: string[];
};

// Layout (little-endian; each section starts on a 4-byte boundary so the browser views it without copying):
//   header (HEADER_BYTES): "SRG1", nodes j, members n, id block bytes b
//   coordinates f32[3j] | ends u32[2n] | sections u32[n] | kinds u8[n] (padded to 4) | ids JSON utf-8 [b]
const MAGIC = 0x31475253; // "SRG1" read as a little-endian u32
const HEADER_BYTES = 16;
const pad4 = (bytes: number) => (bytes + 3) & ~3;

function layout(j: number, n: number, idBytes: number) {
  const coordinates = HEADER_BYTES;
  const ends = coordinates + 12 * j;
  const sections = ends + 8 * n;
  const kinds = sections + 4 * n;
  const ids = kinds + pad4(n);
  return { coordinates, ends, sections, kinds, ids, total: ids + idBytes };
}

/** Packs a (validated) model's geometry into one body for the browser. */
export function packGeometry(model: TrussModel): Uint8Array<ArrayBuffer> {
  const j = model.nodes.length;
  const n = model.members.length;
  const nodeIndex = new Map(model.nodes.map((node, k) => [node.id, k]));
  const sectionIds = [...new Set(model.members.map((m) => m.section))];
  const sectionIndex = new Map(sectionIds.map((id, k) => [id, k]));
  const classes = classifyMembers(model);
  const idBlock = new TextEncoder().encode(JSON.stringify({ nodeIds: model.nodes.map((node) => node.id), memberIds: model.members.map((m) => m.id), sectionIds }));
  const at = layout(j, n, idBlock.byteLength);
  const buffer = new ArrayBuffer(at.total);
  const header = new DataView(buffer);
  header.setUint32(0, MAGIC, true);
  header.setUint32(4, j, true);
  header.setUint32(8, n, true);
  header.setUint32(12, idBlock.byteLength, true);
  const coordinates = new Float32Array(buffer, at.coordinates, 3 * j);
  model.nodes.forEach((node, k) => coordinates.set([node.x, node.y, node.z], 3 * k));
  const ends = new Uint32Array(buffer, at.ends, 2 * n);
  const sections = new Uint32Array(buffer, at.sections, n);
  const kinds = new Uint8Array(buffer, at.kinds, n);
  model.members.forEach((member, k) => {
    // A stored model passed validation, so both ends and the section exist.
    ends[2 * k] = nodeIndex.get(member.i)!;
    ends[2 * k + 1] = nodeIndex.get(member.j)!;
    sections[k] = sectionIndex.get(member.section)!;
    kinds[k] = MEMBER_KIND_CODES.indexOf(classes[member.id]);
  });
  new Uint8Array(buffer, at.ids, idBlock.byteLength).set(idBlock);
  return new Uint8Array(buffer);
}

/** Views a body packed by packGeometry (typed arrays without copies); throws when it is not one. */
export function unpackGeometry(buffer: ArrayBuffer): WireGeometry {
  if (buffer.byteLength < HEADER_BYTES) throw new Error("The roof geometry is truncated.");
  const header = new DataView(buffer);
  if (header.getUint32(0, true) !== MAGIC) throw new Error("The roof geometry is not in the expected format.");
  const j = header.getUint32(4, true);
  const n = header.getUint32(8, true);
  const idBytes = header.getUint32(12, true);
  const at = layout(j, n, idBytes);
  if (buffer.byteLength !== at.total) throw new Error("The roof geometry is truncated.");
  const ids = JSON.parse(new TextDecoder().decode(new Uint8Array(buffer, at.ids, idBytes))) as Pick<WireGeometry, "nodeIds" | "memberIds" | "sectionIds">;
  if (ids.nodeIds.length !== j || ids.memberIds.length !== n) throw new Error("The roof geometry's ids do not match its counts.");
  return {
    coordinates: new Float32Array(buffer, at.coordinates, 3 * j),
    ends: new Uint32Array(buffer, at.ends, 2 * n),
    sections: new Uint32Array(buffer, at.sections, n),
    kinds: new Uint8Array(buffer, at.kinds, n),
    ...ids,
  };
}

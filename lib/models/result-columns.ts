// Results as columns (issue 13 item 4): what is stored per analysis run and sent to the viewer, in member (and node)
// order of the revision's model. Per result: Float32 axial forces, a zero-force bitset and Float32 displacements;
// per run: Float32 utilisation (NaN = no check), a verdict code per member and the zero-in-all bitset. The viewer
// copies these straight into its instance buffers, so a result switch touches no per-member object. Our own small
// binary layout (no package packs typed arrays with this little ceremony); the design-format JSON stays for the CLI
// and the exports. Pure: no I/O.
import type { AnalysisResult } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import { MEMBER_VERDICTS, type MemberVerdictKind } from "@/lib/vocabulary/member-verdict";
import type { StoredReview } from "./analyse";

/** Verdict codes: 0 = no verdict (no review, or a member the review left out), then each verdict by its index + 1. */
export const VERDICT_CODES: readonly MemberVerdictKind[] = MEMBER_VERDICTS;

/** One result's columns as stored. */
export type ResultColumns = { resultId: string; forces: Float32Array; zero: Uint8Array; displacements: Float32Array };
/** The run's columns that do not depend on the result. */
export type RunColumns = { utilisation: Float32Array | null; verdicts: Uint8Array | null; zeroInAll: Uint8Array };

/** Bytes of a bitset of n flags. */
export const bitsetBytes = (n: number) => Math.ceil(n / 8);

/** Packs flags (one per member) into a bitset, bit k % 8 of byte k >> 3. */
export function packBits(count: number, isSet: (k: number) => boolean): Uint8Array {
  const bits = new Uint8Array(bitsetBytes(count));
  for (let k = 0; k < count; k += 1) if (isSet(k)) bits[k >> 3] |= 1 << (k & 7);
  return bits;
}

/** Reads flag k of a bitset. */
export const bitAt = (bits: Uint8Array, k: number) => (bits[k >> 3] >> (k & 7)) & 1;

/** The columns of every result of an analysed model, and the run's own columns, in the model's member order. */
export function encodeResultColumns(model: TrussModel, result: AnalysisResult, review: StoredReview | null): { results: ResultColumns[]; run: RunColumns } {
  const members = model.members;
  const n = members.length;
  const results = Object.entries(result.results).map(([resultId, caseResult]): ResultColumns => {
    const forces = new Float32Array(n);
    members.forEach((member, k) => {
      forces[k] = caseResult.memberForces[member.id] ?? 0;
    });
    const zeroSet = new Set(caseResult.zeroForceMembers);
    const displacements = new Float32Array(model.nodes.length * 3);
    model.nodes.forEach((node, k) => {
      const d = caseResult.displacements[node.id];
      if (d) displacements.set([d.ux, d.uy, d.uz], k * 3);
    });
    return { resultId, forces, zero: packBits(n, (k) => zeroSet.has(members[k].id)), displacements };
  });
  const zeroInAllSet = new Set(result.zeroInAll);
  const zeroInAll = packBits(n, (k) => zeroInAllSet.has(members[k].id));
  if (!review) return { results, run: { utilisation: null, verdicts: null, zeroInAll } };
  const utilisation = new Float32Array(n);
  const verdicts = new Uint8Array(n);
  members.forEach((member, k) => {
    const stored = review.members[member.id];
    utilisation[k] = stored?.utilisation ?? Number.NaN;
    verdicts[k] = stored ? VERDICT_CODES.indexOf(stored.verdict) + 1 : 0;
  });
  return { results, run: { utilisation, verdicts, zeroInAll } };
}

// The wire layout of one result's columns (little-endian; every section starts on a 4-byte boundary so the browser
// can view it as a Float32Array without copying):
//   header (HEADER_BYTES): "SRC1", members n, nodes j, flags (bit 0: has review)
//   forces f32[n] | utilisation f32[n] (NaN without review) | displacements f32[3j]
//   verdicts u8[n] | zero bitset | zero-in-all bitset  (each padded to 4 bytes)
const MAGIC = 0x31435253; // "SRC1" read as a little-endian u32
const HEADER_BYTES = 16;
const pad4 = (bytes: number) => (bytes + 3) & ~3;

/** The columns the viewer draws one result from. */
export type WireColumns = {
  memberCount: number;
  nodeCount: number;
  forces: Float32Array;
  /** NaN where the member has no check; all NaN when the revision has no review. */
  utilisation: Float32Array;
  displacements: Float32Array;
  /** 0 = none, else VERDICT_CODES[code - 1]. */
  verdicts: Uint8Array;
  zero: Uint8Array;
  zeroInAll: Uint8Array;
  hasReview: boolean;
};

function layout(n: number, j: number) {
  const forces = HEADER_BYTES;
  const utilisation = forces + 4 * n;
  const displacements = utilisation + 4 * n;
  const verdicts = displacements + 12 * j;
  const zero = verdicts + pad4(n);
  const zeroInAll = zero + pad4(bitsetBytes(n));
  return { forces, utilisation, displacements, verdicts, zero, zeroInAll, total: zeroInAll + pad4(bitsetBytes(n)) };
}

/** Packs one result's columns and the run's columns into one body for the browser. */
export function packWire(result: ResultColumns, run: RunColumns): Uint8Array<ArrayBuffer> {
  const n = result.forces.length;
  const j = result.displacements.length / 3;
  const at = layout(n, j);
  const buffer = new ArrayBuffer(at.total);
  const header = new DataView(buffer);
  header.setUint32(0, MAGIC, true);
  header.setUint32(4, n, true);
  header.setUint32(8, j, true);
  header.setUint32(12, run.utilisation && run.verdicts ? 1 : 0, true);
  new Float32Array(buffer, at.forces, n).set(result.forces);
  new Float32Array(buffer, at.utilisation, n).set(run.utilisation ?? new Float32Array(n).fill(Number.NaN));
  new Float32Array(buffer, at.displacements, 3 * j).set(result.displacements);
  if (run.verdicts) new Uint8Array(buffer, at.verdicts, n).set(run.verdicts);
  new Uint8Array(buffer, at.zero, bitsetBytes(n)).set(result.zero);
  new Uint8Array(buffer, at.zeroInAll, bitsetBytes(n)).set(run.zeroInAll);
  return new Uint8Array(buffer);
}

/** Views a body packed by packWire (no copies); throws when it is not one. */
export function unpackWire(buffer: ArrayBuffer): WireColumns {
  if (buffer.byteLength < HEADER_BYTES) throw new Error("The result columns are truncated.");
  const header = new DataView(buffer);
  if (header.getUint32(0, true) !== MAGIC) throw new Error("The result columns are not in the expected format.");
  const n = header.getUint32(4, true);
  const j = header.getUint32(8, true);
  const at = layout(n, j);
  if (buffer.byteLength !== at.total) throw new Error("The result columns are truncated.");
  return {
    memberCount: n,
    nodeCount: j,
    forces: new Float32Array(buffer, at.forces, n),
    utilisation: new Float32Array(buffer, at.utilisation, n),
    displacements: new Float32Array(buffer, at.displacements, 3 * j),
    verdicts: new Uint8Array(buffer, at.verdicts, n),
    zero: new Uint8Array(buffer, at.zero, bitsetBytes(n)),
    zeroInAll: new Uint8Array(buffer, at.zeroInAll, bitsetBytes(n)),
    hasReview: (header.getUint32(12, true) & 1) === 1,
  };
}

/**
 * Float32 values from stored bytes, copied: a bytea read back may not start on a 4-byte boundary, and a pg Buffer's
 * slice() is a view into a shared pool, so the copy is made through the Uint8Array constructor.
 */
export function floatsFrom(bytes: Uint8Array): Float32Array {
  return new Float32Array(new Uint8Array(bytes).buffer);
}

/** The browser's body for one result, from the stored result row and its run's columns. */
export function wireFromStored(row: { forces: Uint8Array; zero: Uint8Array; displacements: Uint8Array; utilisation: Uint8Array | null; verdicts: Uint8Array | null; zeroInAll: Uint8Array | null }): Uint8Array<ArrayBuffer> {
  const forces = floatsFrom(row.forces);
  return packWire(
    { resultId: "", forces, zero: row.zero, displacements: floatsFrom(row.displacements) },
    { utilisation: row.utilisation ? floatsFrom(row.utilisation) : null, verdicts: row.verdicts, zeroInAll: row.zeroInAll ?? new Uint8Array(bitsetBytes(forces.length)) },
  );
}

/** One member's force and zero flag per result, from the 4 force bytes and the bitset byte read at its index. */
export function memberResultsFrom(index: number, rows: { resultId: string; force: Uint8Array; zeroByte: Uint8Array }[]): Record<string, { force: number; zero: boolean }> {
  return Object.fromEntries(rows.map((row) => [row.resultId, { force: floatsFrom(row.force)[0], zero: ((row.zeroByte[0] >> (index & 7)) & 1) === 1 }]));
}

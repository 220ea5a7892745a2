// The JSON text of a large stored document (the analysis result of design.md, the member review) as UTF-8 bytes,
// written piece by piece. JSON.stringify of a 120 x 120 roof's review makes one 196 MB string, and turning it into
// bytes for PostgreSQL copies it again; here every entry of a large object or array is stringified on its own
// (natively) and encoded straight into one growing byte buffer, so no string larger than one entry is ever made.
// The text is exactly JSON.stringify's (lib/models/json-bytes.test.ts checks it against JSON.stringify itself).
// Own code, not @discoveryjs/json-ext's stringifyChunked: that walks every value in JavaScript and yields strings
// (1.7-2.8 x the time of this on the 60 x 60 review, measured on this machine), where only bytes are wanted here.
// Pure: no I/O.

/**
 * Containers this near the top are always written entry by entry (the documents' big parts sit there: a review's
 * members, a result's results); deeper ones only when they have more than SPLIT_ABOVE entries, else in one
 * JSON.stringify (one member's review, one result's forces: a few MB at most).
 */
const SPLIT_DEPTH = 2;
const SPLIT_ABOVE = 32;
/** UTF-8 takes at most 3 bytes per UTF-16 code unit (a surrogate pair: 4 bytes for 2 units). */
const MAX_BYTES_PER_UNIT = 3;
/** PostgreSQL stores no field over 1 GB, so no stored document is larger. */
const MAX_DOCUMENT_BYTES = 2 ** 30;

const encoder = new TextEncoder();

/**
 * A growing UTF-8 buffer on a resizable ArrayBuffer: growing commits memory in place (no copy, no old buffer left
 * for the garbage collector), and the finished document is shrunk to its length.
 */
class ByteWriter {
  private readonly buffer = new ArrayBuffer(0, { maxByteLength: MAX_DOCUMENT_BYTES });
  private readonly bytes = new Uint8Array(this.buffer);
  private length = 0;

  write(text: string) {
    const needed = this.length + text.length * MAX_BYTES_PER_UNIT;
    if (needed > this.buffer.byteLength) this.buffer.resize(Math.min(MAX_DOCUMENT_BYTES, Math.max(needed, 2 * this.buffer.byteLength)));
    const { read, written } = encoder.encodeInto(text, this.bytes.subarray(this.length));
    if (read !== text.length) throw new Error(`the JSON to store passes PostgreSQL's limit of ${MAX_DOCUMENT_BYTES / 2 ** 30} GB per value`);
    this.length += written;
  }

  /** The bytes written, their buffer cut to their length (it can be transferred to another thread). */
  done(): Uint8Array<ArrayBuffer> {
    this.buffer.resize(this.length);
    return new Uint8Array(this.buffer, 0, this.length);
  }
}

const isPlainContainer = (value: unknown): value is object =>
  typeof value === "object" && value !== null && typeof (value as { toJSON?: unknown }).toJSON !== "function";

function writeValue(out: ByteWriter, value: unknown, depth: number, inArray: boolean) {
  if (isPlainContainer(value)) {
    const split = (entries: number) => depth < SPLIT_DEPTH || entries > SPLIT_ABOVE;
    if (Array.isArray(value) && split(value.length)) return writeArray(out, value, depth);
    if (!Array.isArray(value) && split(Object.keys(value).length)) return writeObject(out, value as Record<string, unknown>, depth);
  }
  // JSON.stringify gives undefined for undefined, functions and symbols: an array holds null in their place.
  out.write(JSON.stringify(value) ?? (inArray ? "null" : ""));
}

function writeArray(out: ByteWriter, values: unknown[], depth: number) {
  out.write("[");
  values.forEach((value, k) => {
    if (k > 0) out.write(",");
    writeValue(out, value, depth + 1, true);
  });
  out.write("]");
}

function writeObject(out: ByteWriter, record: Record<string, unknown>, depth: number) {
  out.write("{");
  let first = true;
  for (const key of Object.keys(record)) {
    const value = record[key];
    // the entries JSON.stringify leaves out of an object
    if (value === undefined || typeof value === "function" || typeof value === "symbol") continue;
    out.write(`${first ? "" : ","}${JSON.stringify(key)}:`);
    first = false;
    writeValue(out, value, depth + 1, false);
  }
  out.write("}");
}

/** The UTF-8 bytes of JSON.stringify(value), for plain data (no cycles); never holds the whole text as a string. */
export function jsonBytes(value: unknown): Uint8Array<ArrayBuffer> {
  const out = new ByteWriter();
  writeValue(out, value, 0, false);
  return out.done();
}

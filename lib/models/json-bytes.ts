// The JSON text of a large stored document (the analysis result of design.md, the member review) as UTF-8 bytes,
// written piece by piece. JSON.stringify of a 120 x 120 roof's review makes one 196 MB string, and turning it into
// bytes for PostgreSQL copies it again; here every entry of a large object or array is stringified on its own
// (natively) and encoded straight into one growing byte buffer, so no string larger than one entry is ever alive.
// The text is exactly JSON.stringify's (lib/models/json-bytes.test.ts checks it against JSON.stringify itself).
// Own code, not @discoveryjs/json-ext's stringifyChunked: that walks every value in JavaScript and yields strings
// (1.9 x the time of this on the 60 x 60 review, measured on this machine), where only bytes are wanted here.
// Pure: no I/O.

/** Containers with more entries than this are written entry by entry; smaller ones in one JSON.stringify. */
const SPLIT_ABOVE = 32;
/** UTF-8 takes at most 3 bytes per UTF-16 code unit (a surrogate pair: 4 bytes for 2 units). */
const MAX_BYTES_PER_UNIT = 3;

const encoder = new TextEncoder();

/** A growing UTF-8 buffer: doubles when full, so a document of n bytes is copied O(log n) times, not per piece. */
class ByteWriter {
  private bytes = new Uint8Array(1 << 16);
  length = 0;

  write(text: string) {
    const needed = this.length + text.length * MAX_BYTES_PER_UNIT;
    if (needed > this.bytes.length) {
      const grown = new Uint8Array(Math.max(needed, this.bytes.length * 2));
      grown.set(this.bytes.subarray(0, this.length));
      this.bytes = grown;
    }
    this.length += encoder.encodeInto(text, this.bytes.subarray(this.length)).written;
  }

  /** The bytes written, as a view (no copy) whose buffer can be transferred to another thread. */
  done(): Uint8Array<ArrayBuffer> {
    return this.bytes.subarray(0, this.length);
  }
}

const isPlainContainer = (value: unknown): value is object =>
  typeof value === "object" && value !== null && typeof (value as { toJSON?: unknown }).toJSON !== "function";

function writeValue(out: ByteWriter, value: unknown, inArray: boolean) {
  if (isPlainContainer(value)) {
    if (Array.isArray(value) && value.length > SPLIT_ABOVE) return writeArray(out, value);
    if (!Array.isArray(value) && Object.keys(value).length > SPLIT_ABOVE) return writeObject(out, value as Record<string, unknown>);
  }
  // JSON.stringify gives undefined for undefined, functions and symbols: an array holds null in their place.
  out.write(JSON.stringify(value) ?? (inArray ? "null" : ""));
}

function writeArray(out: ByteWriter, values: unknown[]) {
  out.write("[");
  values.forEach((value, k) => {
    if (k > 0) out.write(",");
    writeValue(out, value, true);
  });
  out.write("]");
}

function writeObject(out: ByteWriter, record: Record<string, unknown>) {
  out.write("{");
  let first = true;
  for (const key of Object.keys(record)) {
    const value = record[key];
    // the entries JSON.stringify leaves out of an object
    if (value === undefined || typeof value === "function" || typeof value === "symbol") continue;
    out.write(`${first ? "" : ","}${JSON.stringify(key)}:`);
    first = false;
    writeValue(out, value, false);
  }
  out.write("}");
}

/** The UTF-8 bytes of JSON.stringify(value), for plain data (no cycles); never holds the whole text as a string. */
export function jsonBytes(value: unknown): Uint8Array<ArrayBuffer> {
  const out = new ByteWriter();
  writeValue(out, value, false);
  return out.done();
}

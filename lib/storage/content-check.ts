// What may be stored, judged by the bytes and never by the file name or the browser's declared type.
import { fileTypeFromBuffer } from "file-type";
import Papa from "papaparse";
import { modelFileBytes } from "@/lib/limits";

/** What a stored file is for; each purpose accepts its own content types and size. */
export const FILE_PURPOSES = ["comment", "model", "run", "snapshot", "report"] as const;
export type FilePurpose = (typeof FILE_PURPOSES)[number];
/** Purposes a browser may upload through a presigned URL; snapshots and reports are only stored by the server itself. */
export const UPLOAD_PURPOSES = ["comment", "model", "run"] as const satisfies readonly FilePurpose[];
export type UploadPurpose = (typeof UPLOAD_PURPOSES)[number];

const MB = 1024 * 1024;

/** Accepted content per purpose. Binary kinds are recognised by magic bytes (file-type); text kinds by parsing. */
export const FILE_RULES = {
  comment: { maxBytes: 10 * MB, types: ["image/png", "image/jpeg", "image/webp", "application/pdf"] },
  model: { maxBytes: modelFileBytes, types: ["application/json", "text/csv"] },
  run: { maxBytes: 10 * MB, types: ["application/json", "text/csv"] },
  // A saved view's canvas capture (and the snapshot of an imported BCF viewpoint).
  snapshot: { maxBytes: 5 * MB, types: ["image/png"] },
  // A review report PDF the jobs process made.
  report: { maxBytes: 50 * MB, types: ["application/pdf"] },
} as const satisfies Record<FilePurpose, { maxBytes: number; types: readonly string[] }>;

/** How many leading bytes a binary check needs (file-type reads at most this many for the kinds we accept). */
export const HEAD_BYTES = 4100;

const TEXT_TYPES = new Set(["application/json", "text/csv"]);

/** True when the purpose accepts only text kinds, so the whole file (within its size limit) must be read. */
export function needsWholeFile(purpose: FilePurpose): boolean {
  return FILE_RULES[purpose].types.every((type) => TEXT_TYPES.has(type));
}

export type ContentVerdict =
  | { ok: true; contentType: string }
  | { ok: false; reason: "too_large" | "empty" | "type_not_allowed" | "unreadable"; message: string };

const LABELS: Record<FilePurpose, string> = {
  comment: "an image (PNG, JPEG, WebP) or a PDF",
  model: "a model file in JSON or a CSV table",
  run: "a run file in JSON or CSV",
  snapshot: "a PNG image",
  report: "a PDF",
};

function formatMb(bytes: number): string {
  return `${(bytes / MB).toFixed(bytes % MB === 0 ? 0 : 1)} MB`;
}

/** The size check alone, usable before any byte is read (declared size) and after (stored size). */
export function checkSize(purpose: FilePurpose, size: number): ContentVerdict | null {
  const { maxBytes } = FILE_RULES[purpose];
  if (size <= 0) return { ok: false, reason: "empty", message: "The file is empty." };
  if (size > maxBytes) {
    return { ok: false, reason: "too_large", message: `The file is ${formatMb(size)}; the limit is ${formatMb(maxBytes)}.` };
  }
  return null;
}

function decodeUtf8(bytes: Uint8Array): string | null {
  if (bytes.includes(0)) return null;
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
}

function textKind(text: string, accepted: readonly string[]): string | null {
  const body = text.replace(/^\uFEFF/, "").trim();
  if (accepted.includes("application/json") && (body.startsWith("{") || body.startsWith("["))) {
    try {
      JSON.parse(body);
      return "application/json";
    } catch {
      return null;
    }
  }
  if (accepted.includes("text/csv")) {
    const parsed = Papa.parse<string[]>(body, { skipEmptyLines: true });
    const rows = parsed.data;
    // A table: a header of more than one column and rows as wide as it. A header alone is still a table: an
    // optional model table (loads, say) may be uploaded empty.
    if (parsed.errors.length === 0 && rows.length >= 1 && rows[0].length >= 2 && rows.every((row) => row.length === rows[0].length)) {
      return "text/csv";
    }
  }
  return null;
}

/**
 * Judges a file by its bytes: `bytes` is the head of the file (at least HEAD_BYTES, or all of it when shorter)
 * for binary kinds, and the whole file for purposes that accept only text; `size` is the full stored size.
 */
export async function checkContent(purpose: FilePurpose, bytes: Uint8Array, size: number): Promise<ContentVerdict> {
  const sizeVerdict = checkSize(purpose, size);
  if (sizeVerdict) return sizeVerdict;
  const accepted: readonly string[] = FILE_RULES[purpose].types;
  const detected = await fileTypeFromBuffer(bytes);
  if (detected) {
    if (accepted.includes(detected.mime)) return { ok: true, contentType: detected.mime };
    return {
      ok: false,
      reason: "type_not_allowed",
      message: `The file's content is ${detected.ext.toUpperCase()} (${detected.mime}); here only ${LABELS[purpose]} is accepted.`,
    };
  }
  const hasTextKind = accepted.some((type) => TEXT_TYPES.has(type));
  const text = hasTextKind ? decodeUtf8(bytes) : null;
  const kind = text === null ? null : textKind(text, accepted);
  if (kind) return { ok: true, contentType: kind };
  return {
    ok: false,
    reason: hasTextKind ? "unreadable" : "type_not_allowed",
    message: `The file's content is not ${LABELS[purpose]}.`,
  };
}

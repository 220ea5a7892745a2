// Turns the text of uploaded model files into the request buildRevision reads: one JSON model, or CSV tables.
import { ValidationError } from "@/lib/http/errors";
import { locateJsonError } from "@/lib/json-errors";
import { refuseOversizedModelText } from "./count-scan";
import type { InlineRevisionRequest } from "./schemas";

export type UploadedModelFile = { filename: string; contentType: string; text: string };

/** One JSON model file (refused with 413 when over the model caps), or only CSV tables; anything else is a 400 naming the files. */
export function requestFromUploadedFiles(files: UploadedModelFile[], name: string | undefined): InlineRevisionRequest {
  const json = files.filter((f) => f.contentType === "application/json");
  const csv = files.filter((f) => f.contentType === "text/csv");
  if (json.length === 1 && csv.length === 0) {
    // Counts first (413 naming the limit): a model over the caps is never parsed.
    refuseOversizedModelText(json[0].text, json[0].filename);
    let model: unknown;
    try {
      model = JSON.parse(json[0].text);
    } catch {
      const where = locateJsonError(json[0].text)?.message ?? "not valid JSON";
      throw new ValidationError([{ path: json[0].filename, message: where }], `${json[0].filename} is not valid JSON (${where}).`);
    }
    return { kind: "uploadJson", name, fileName: json[0].filename, model };
  }
  if (csv.length === files.length) return { kind: "uploadCsv", name: name ?? "Uploaded model", tables: Object.fromEntries(csv.map((f) => [f.filename, f.text])) };
  const message = "Upload one .json model file, or the .csv tables (nodes, members, sections, supports, loads…).";
  throw new ValidationError([{ path: "attachmentIds", message }], message);
}

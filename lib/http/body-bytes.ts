import { HttpError } from "./errors";

/** Reads a raw request body (an uploaded file) up to `limit` bytes; larger bodies are a 413 before reading on. */
export async function readBodyBytes(request: Request, limit: number): Promise<Uint8Array> {
  const tooLarge = () => new HttpError(413, `The file is larger than ${Math.round(limit / 1024 / 1024)} MB.`);
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > limit) throw tooLarge();
  const chunks: Uint8Array[] = [];
  let total = 0;
  const reader = request.body?.getReader();
  while (reader) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  const bytes = new Uint8Array(total);
  let offset = 0;
  for (const chunk of chunks) {
    bytes.set(chunk, offset);
    offset += chunk.byteLength;
  }
  return bytes;
}

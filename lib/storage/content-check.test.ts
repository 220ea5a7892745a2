import { describe, expect, it } from "vitest";
import { checkContent, checkSize, FILE_RULES, needsWholeFile } from "./content-check";

// Magic numbers below are from the published format specifications (PNG: ISO/IEC 15948 / W3C PNG spec §5.2
// signature; JPEG: ITU-T T.81 SOI marker FFD8 + JFIF APP0; WebP: RIFF container "RIFF....WEBPVP8"; PDF: ISO 32000
// "%PDF-" header; Windows executables: the "MZ" DOS header). The 1x1 PNG is a common-practice test image.
const PNG_1X1 = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==", "base64");
const JPEG_HEAD = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00]);
const WEBP_HEAD = Buffer.concat([Buffer.from("RIFF"), Buffer.from([0x24, 0, 0, 0]), Buffer.from("WEBPVP8 "), Buffer.alloc(24)]);
const PDF_HEAD = Buffer.from("%PDF-1.7\n%\xe2\xe3\xcf\xd3\n1 0 obj\n<< /Type /Catalog >>\nendobj\n", "latin1");
const EXE_HEAD = Buffer.concat([Buffer.from("MZ"), Buffer.alloc(58), Buffer.from([0x80, 0, 0, 0]), Buffer.alloc(64), Buffer.from("PE\0\0"), Buffer.alloc(200)]);

describe("checkContent for comment attachments", () => {
  it("accepts PNG, JPEG, WebP and PDF by their bytes", async () => {
    expect(await checkContent("comment", PNG_1X1, PNG_1X1.length)).toEqual({ ok: true, contentType: "image/png" });
    expect(await checkContent("comment", JPEG_HEAD, 2048)).toEqual({ ok: true, contentType: "image/jpeg" });
    expect(await checkContent("comment", WEBP_HEAD, WEBP_HEAD.length)).toEqual({ ok: true, contentType: "image/webp" });
    expect(await checkContent("comment", PDF_HEAD, PDF_HEAD.length)).toEqual({ ok: true, contentType: "application/pdf" });
  });

  it("refuses an executable whatever it is called, naming what it really is", async () => {
    const verdict = await checkContent("comment", EXE_HEAD, EXE_HEAD.length);
    expect(verdict.ok).toBe(false);
    if (!verdict.ok) {
      expect(verdict.reason).toBe("type_not_allowed");
      expect(verdict.message).toMatch(/EXE/);
    }
  });

  it("refuses plain text and JSON as a comment attachment", async () => {
    const verdict = await checkContent("comment", Buffer.from('{"a":1}'), 7);
    expect(verdict).toMatchObject({ ok: false, reason: "type_not_allowed" });
  });

  it("refuses an over-size file before looking at its content", async () => {
    const verdict = await checkContent("comment", PNG_1X1, FILE_RULES.comment.maxBytes + 1);
    expect(verdict).toMatchObject({ ok: false, reason: "too_large" });
    if (!verdict.ok) expect(verdict.message).toContain("the limit is 10 MB");
    expect(checkSize("comment", 0)).toMatchObject({ ok: false, reason: "empty" });
    expect(checkSize("comment", FILE_RULES.comment.maxBytes)).toBeNull();
  });
});

describe("checkContent for model and run files", () => {
  it("accepts JSON models and JSON or CSV runs", async () => {
    const model = Buffer.from(JSON.stringify({ format: "truss-model/1", name: "Northfield hall" }));
    expect(await checkContent("model", model, model.length)).toEqual({ ok: true, contentType: "application/json" });
    const csv = Buffer.from("run,x1,y1,z1,x2,y2,z2,diameter\nD1,0,0,5.2,12,0,5.2,0.4\n");
    expect(await checkContent("run", csv, csv.length)).toEqual({ ok: true, contentType: "text/csv" });
    const headerOnly = Buffer.from("loadCase,node,fx,fy,fz\n");
    expect(await checkContent("model", headerOnly, headerOnly.length)).toEqual({ ok: true, contentType: "text/csv" });
    expect(needsWholeFile("model")).toBe(true);
    expect(needsWholeFile("comment")).toBe(false);
  });

  it("refuses broken JSON, ragged CSV, binary bytes and a PNG named .json", async () => {
    const broken = Buffer.from('{"format": "truss-model/1", ');
    expect(await checkContent("model", broken, broken.length)).toMatchObject({ ok: false, reason: "unreadable" });
    const ragged = Buffer.from("a,b,c\n1,2\n");
    expect(await checkContent("run", ragged, ragged.length)).toMatchObject({ ok: false, reason: "unreadable" });
    const binary = Buffer.from([0x7b, 0x00, 0x7d]);
    expect(await checkContent("model", binary, binary.length)).toMatchObject({ ok: false, reason: "unreadable" });
    expect(await checkContent("model", PNG_1X1, PNG_1X1.length)).toMatchObject({ ok: false, reason: "type_not_allowed" });
  });
});

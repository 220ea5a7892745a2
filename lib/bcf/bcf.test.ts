import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { strFromU8, unzipSync, zipSync } from "fflate";
import { describe, expect, it } from "vitest";
import { validateXML } from "xmllint-wasm";
import { bcfEntries, inspectBcf, readBcf, writeBcf, type BcfFile } from "./index";

// The official BCF 3.0 schemas and test archives (buildingSMART, CC BY-ND 4.0), copied unmodified.
const fixtures = join(process.cwd(), "tests/fixtures/bcf");
const schema = (name: string) => ({ fileName: name, contents: readFileSync(join(fixtures, "schemas", name), "utf8") });
const sharedTypes = schema("shared-types.xsd");

async function validate(fileName: string, xml: string, xsd: string) {
  const result = await validateXML({ xml: { fileName, contents: xml }, schema: schema(xsd), preload: [sharedTypes] });
  return result.errors.map((e) => e.rawMessage);
}

const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52]);
const file: BcfFile = {
  version: "3.0",
  project: { id: "4f0c6f55-7d5e-4f0b-9d1e-2f6f2a1b0c01", name: "Northfield <roof> & canopy" },
  topics: [
    {
      guid: "0b7f3c4e-2a9d-4c1e-8f3a-5d6e7f809a1b",
      title: "Can duct SA-01 pass \"B-17\" at gridline 4 & 5?",
      status: "Open",
      type: "Question",
      creationDate: "2026-11-30T09:15:00.000Z",
      creationAuthor: "architect@northfield-demo.test",
      modifiedDate: "2026-11-30T10:00:00.000Z",
      dueDate: "2026-12-10T00:00:00.000Z",
      assignedTo: "structural@northfield-demo.test",
      description: "Duct below the bottom chord.",
      labels: ["mep", "structural"],
      comments: [
        { guid: "6a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c4d", date: "2026-11-30T09:15:00.000Z", author: "architect@northfield-demo.test", text: "See the selected member.", viewpointGuid: "9c8b7a6d-5e4f-4a3b-9c2d-1e0f9a8b7c6d" },
        { guid: "7b2c3d4e-5f6a-4b7c-9d8e-0f1a2b3c4d5e", date: "2026-11-30T10:00:00.000Z", author: "structural@northfield-demo.test", text: "Idle member; opening possible with a ring plate." },
      ],
      viewpoints: [
        {
          guid: "9c8b7a6d-5e4f-4a3b-9c2d-1e0f9a8b7c6d",
          camera: { kind: "perspective", position: [24, -18, 20], direction: [-0.5, 0.6, -0.6244997998398398], up: [0, 0, 1], fieldOfView: 50, aspectRatio: 1.6 },
          selection: ["1AAAAAAAAAAAAAAAAAAA$1"],
          clippingPlanes: [
            { location: [0, 0, 0], direction: [-1, 0, 0] },
            { location: [48, 36, 12], direction: [0, 0, 1] },
          ],
          snapshot: png,
        },
      ],
    },
    {
      guid: "1c8f4d5e-3b0e-4d2f-9a4b-6e7f8091ab2c",
      title: "Closed with an orthogonal view",
      status: "Closed",
      type: "Clash",
      creationDate: "2026-11-29T08:00:00.000Z",
      creationAuthor: "mep@northfield-demo.test",
      labels: [],
      comments: [],
      viewpoints: [{ guid: "2d9e5f6a-4c1f-4e3a-8b5c-7f8091a2b3c4", camera: { kind: "orthogonal", position: [24, 18, 40], direction: [0, 0, -1], up: [0, 1, 0], viewToWorldScale: 30, aspectRatio: 1.5 }, selection: [], clippingPlanes: [] }],
    },
  ],
};

describe("BCF 3.0 export", () => {
  it("writes XML that validates against the official BCF 3.0 schemas", async () => {
    const entries = bcfEntries(file, ["Open", "Answered", "Closed"]);
    const xsdFor = (path: string) =>
      path === "bcf.version" ? "version.xsd" : path === "extensions.xml" ? "extensions.xsd" : path === "project.bcfp" ? "project.xsd" : path.endsWith(".bcfv") ? "visinfo.xsd" : "markup.xsd";
    expect(Object.keys(entries).length).toBe(3 + 2 + 2);
    for (const [path, xml] of Object.entries(entries)) expect(await validate(path.replace("/", "_"), xml, xsdFor(path)), path).toEqual([]);
  }, 60_000);

  it("the validation can fail: a topic without a title is refused by markup.xsd", async () => {
    const xml = bcfEntries(file, [])[`${file.topics[0].guid}/markup.bcf`].replace(/<Title>.*<\/Title>/, "");
    expect((await validate("markup.bcf", xml, "markup.xsd")).join("\n")).toContain("Expected is one of ( ReferenceLinks, Title )");
  }, 60_000);

  it("round-trips: the archive reads back into the same topics, comments, viewpoints and snapshots", () => {
    const { file: back, problems } = readBcf(writeBcf(file, ["Open", "Answered", "Closed"]));
    expect(problems).toEqual([]);
    expect(back).toEqual(file);
  });
});

describe("BCF import of the official BCF 3.0 test cases", () => {
  const archives = readdirSync(join(fixtures, "test-cases")).filter((f) => f.endsWith(".bcf"));
  it("has the six archives", () => expect(archives).toHaveLength(6));
  for (const name of archives) {
    it(`${name}: no problems; topic and comment counts as in its markup files`, () => {
      const bytes = new Uint8Array(readFileSync(join(fixtures, "test-cases", name)));
      // Counted independently of our reader: markup files in the zip, and <Comment Guid=...> elements in them.
      const raw = unzipSync(bytes);
      const markups = Object.keys(raw).filter((p) => p.endsWith("markup.bcf"));
      const commentCount = markups.reduce((n, p) => n + (strFromU8(raw[p]).match(/<Comment\s+Guid=/g) ?? []).length, 0);
      const { file: read, problems } = readBcf(bytes);
      expect(problems).toEqual([]);
      expect(read!.version).toBe("3.0");
      expect(read!.topics).toHaveLength(markups.length);
      expect(read!.topics.reduce((n, t) => n + t.comments.length, 0)).toBe(commentCount);
    });
  }
  it("reads what the test cases are about: labels, due date, assignee, selected components, perspective camera", () => {
    const read = (name: string) => readBcf(new Uint8Array(readFileSync(join(fixtures, "test-cases", name)))).file!.topics[0];
    expect(read("Labels.bcf").labels.length).toBeGreaterThan(0);
    expect(read("DueDate.bcf").dueDate).toMatch(/^\d{4}-\d\d-\d\d/);
    expect(read("User assignment.bcf").assignedTo).toBe("Architect@example.com");
    expect(read("component selection.bcf").viewpoints[0].selection).toEqual(["0KkZ20so9BsO1d1hFcfLOl", "1XbKhGD91DvhOpYZbhzGTI", "3D9pjHJ0HCnggyepvsht8s"]);
    expect(read("perspective camera.bcf").viewpoints[0].camera?.kind).toBe("perspective");
    expect(inspectBcf(readBcf(new Uint8Array(readFileSync(join(fixtures, "test-cases", "User assignment.bcf")))).file!).topics[0]).toEqual({
      guid: "7ad1a717-bf20-4c12-b511-cbd90370ddba",
      title: "User assignment",
      status: "OPEN",
      type: "ERROR",
      comments: 1,
      viewpoints: 1,
    });
  });
});

describe("BCF import refuses hostile archives", () => {
  it("not a zip, a zip bomb, a DOCTYPE, a topic without GUID", () => {
    expect(readBcf(new TextEncoder().encode("not a zip")).problems[0].message).toContain("not a readable BCF zip");
    const bomb = zipSync({ "bcf.version": new Uint8Array(30 * 1024 * 1024) }, { level: 9 });
    expect(bomb.byteLength).toBeLessThan(1024 * 1024);
    expect(readBcf(bomb).problems[0].message).toContain("over the archive limits");
    const enc = (s: string) => new TextEncoder().encode(s);
    const doctype = zipSync({ "bcf.version": enc('<!DOCTYPE x [<!ENTITY a "aaaa">]><Version VersionId="3.0"/>') });
    expect(readBcf(doctype).problems).toContainEqual({ where: "bcf.version", message: "XML with a DOCTYPE is refused" });
    const noGuid = zipSync({ "bcf.version": enc('<Version VersionId="3.0"/>'), "x/markup.bcf": enc('<Markup><Topic Guid="x" TopicType="a" TopicStatus="b"><Title>t</Title></Topic></Markup>') });
    expect(readBcf(noGuid).problems).toEqual([{ where: "x/markup.bcf", message: 'topic Guid "x" is not a GUID' }]);
    // Compressing the 30 MB bomb takes seconds on a loaded machine; the limit is a hang guard, not a measurement.
  }, 60_000);
});

import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { validateXML } from "xmllint-wasm";
import { memberGlobalId } from "@/lib/ifc/guid";
import { bcfEntries, bcfFromPins, type PinForBcf } from "./index";

// The official BCF 3.0 schemas (buildingSMART, CC BY-ND 4.0), copied unmodified into the fixtures.
const schemas = join(process.cwd(), "tests/fixtures/bcf/schemas");
const schema = (name: string) => ({ fileName: name, contents: readFileSync(join(schemas, name), "utf8") });
async function validate(fileName: string, xml: string, xsd: string) {
  const result = await validateXML({ xml: { fileName, contents: xml }, schema: schema(xsd), preload: [schema("shared-types.xsd")] });
  return result.errors.map((e) => e.rawMessage);
}

// Our demo scenario: a question on a bottom chord with the pin's saved view, and a reply written with its own view.
const pin: PinForBcf = {
  id: "3f1d2c4b-5a6e-4f70-8a91-b2c3d4e5f601",
  bcfGuid: null,
  title: "Can SA-02 pass under BCX-7-5?",
  state: "open",
  discipline: "mep",
  authorEmail: "mep@northfield-demo.test",
  createdAt: new Date("2026-12-01T09:00:00Z"),
  updatedAt: new Date("2026-12-01T10:00:00Z"),
  labels: [],
  assignedTo: null,
  dueAt: null,
  anchor: "member BCX-7-5 at 21.0, 15.0, 0.0",
  viewpoint: { camera: { position: [30, -10, 20], target: [21, 15, 0] }, selectedMember: "BCX-7-5" },
  comments: [
    { id: "4a2e3d5c-6b7f-4081-9ba2-c3d4e5f60712", bcfGuid: null, body: "The riser runs here.", authorEmail: "mep@northfield-demo.test", externalAuthor: null, createdAt: new Date("2026-12-01T09:00:00Z"), viewpoint: null },
    {
      id: "5b3f4e6d-7c80-4192-acb3-d4e5f6071823",
      bcfGuid: null,
      body: "From below, with the section box on the bay.",
      authorEmail: "structural@northfield-demo.test",
      externalAuthor: null,
      createdAt: new Date("2026-12-01T10:00:00Z"),
      viewpoint: { camera: { position: [21, 15, -8], target: [21, 15, 0], up: [0, 1, 0] }, sectionBox: { min: [18, 12, -1], max: [24, 18, 2] }, colouring: "deltaForce" },
    },
  ],
};

describe("comments' saved views in the BCF export", () => {
  const file = bcfFromPins({ id: "6c4a5f7e-8d91-4203-bdc4-e5f607182934", name: "Northfield" }, [pin], memberGlobalId);
  const topic = file.topics[0];

  it("gives a comment written with a view its own viewpoint, and leaves the pin's view on the first comment", () => {
    expect(topic.viewpoints.map((v) => v.guid)).toEqual(["ffffffff-5a6e-4f70-8a91-b2c3d4e5f601", "eeeeeeee-7c80-4192-acb3-d4e5f6071823"]);
    expect(topic.comments.map((c) => c.viewpointGuid)).toEqual(["ffffffff-5a6e-4f70-8a91-b2c3d4e5f601", "eeeeeeee-7c80-4192-acb3-d4e5f6071823"]);
    // The reply's section box as six outward clipping planes, its camera looking straight up (+z) with y up.
    const reply = topic.viewpoints[1];
    expect(reply.clippingPlanes).toHaveLength(6);
    expect(reply.camera).toMatchObject({ kind: "perspective", position: [21, 15, -8], direction: [0, 0, 1], up: [0, 1, 0] });
  });

  it("writes markup and viewpoint files that validate against the official BCF 3.0 schemas", async () => {
    const entries = bcfEntries(file, ["Open", "Answered", "Closed"]);
    const topicFiles = Object.entries(entries).filter(([path]) => path.startsWith(`${topic.guid}/`));
    expect(topicFiles.map(([path]) => path).sort()).toEqual(
      [`${topic.guid}/markup.bcf`, `${topic.guid}/viewpoint-eeeeeeee-7c80-4192-acb3-d4e5f6071823.bcfv`, `${topic.guid}/viewpoint-ffffffff-5a6e-4f70-8a91-b2c3d4e5f601.bcfv`].sort(),
    );
    for (const [path, xml] of topicFiles) expect(await validate(path.replace("/", "_"), xml, path.endsWith(".bcfv") ? "visinfo.xsd" : "markup.xsd"), path).toEqual([]);
    expect(entries[`${topic.guid}/markup.bcf`]).toContain('<Viewpoint Guid="eeeeeeee-7c80-4192-acb3-d4e5f6071823"/>');
  }, 60_000);
});

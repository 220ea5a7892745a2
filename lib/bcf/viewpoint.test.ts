import { describe, expect, it } from "vitest";
import { disciplineOf, pinStateOf } from "./pins";
import { fromBcfViewpoint, toBcfViewpoint } from "./viewpoint";

describe("pin views as BCF viewpoints", () => {
  const view = { camera: { position: [10, 0, 5] as [number, number, number], target: [0, 0, 5] as [number, number, number] }, selectedMember: "B-17", sectionBox: { min: [0, 0, 0] as [number, number, number], max: [48, 36, 12] as [number, number, number] } };
  const toGuid = (id: string) => `GUID-${id}`;

  it("writes the camera direction and an up vector perpendicular to it, the member's GlobalId and six box planes", () => {
    const v = toBcfViewpoint("g", view, toGuid);
    expect(v.camera).toMatchObject({ kind: "perspective", position: [10, 0, 5], direction: [-1, 0, 0], up: [0, 0, 1] });
    expect(v.selection).toEqual(["GUID-B-17"]);
    expect(v.clippingPlanes).toHaveLength(6);
    expect(v.clippingPlanes[0]).toEqual({ location: [0, 0, 0], direction: [-1, 0, 0] });
  });

  it("reads them back: same position, member, and section box; looking straight down gets y as up", () => {
    const back = fromBcfViewpoint(toBcfViewpoint("g", view, toGuid), (g) => (g === "GUID-B-17" ? "B-17" : undefined));
    expect(back).toMatchObject({ camera: { position: [10, 0, 5], target: [0, 0, 5] }, selectedMember: "B-17", sectionBox: view.sectionBox });
    const down = toBcfViewpoint("g", { camera: { position: [0, 0, 10], target: [0, 0, 0] } }, toGuid);
    expect(down.camera?.up).toEqual([0, 1, 0]);
  });

  it("maps other tools' statuses and types onto ours (unknown ones to open and general)", () => {
    expect(["OPEN", "IN_PROGRESS", "Solved", "Closed", "whatever"].map(pinStateOf)).toEqual(["open", "open", "answered", "closed", "open"]);
    expect(["MEP", "ERROR", "structural"].map(disciplineOf)).toEqual(["mep", "general", "structural"]);
  });
});

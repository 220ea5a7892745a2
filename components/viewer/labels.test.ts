import { Matrix4, PerspectiveCamera } from "three";
import { describe, expect, it } from "vitest";
import { labelSpots, type LabelInput } from "./labels";

// Reference camera: three.js's PerspectiveCamera (npm), looking straight down on a row of nodes along x.
const viewport = { width: 400, height: 300 };
const camera = new PerspectiveCamera(40, viewport.width / viewport.height, 0.1, 1000);
camera.up.set(0, 0, 1);
camera.position.set(5, -0.01, 20);
camera.lookAt(5, 0, 0);
camera.updateMatrixWorld();
const viewProjection = new Matrix4().multiplyMatrices(camera.projectionMatrix, camera.matrixWorldInverse).elements;

// Invented geometry: nodes N0..N10 at x = 0..10 m, members M0..M9 between neighbours, and a far node off screen.
const nodeIds = [...Array.from({ length: 11 }, (_, k) => `N${k}`), "FAR"];
const positions = Float32Array.from([...Array.from({ length: 11 }, (_, k) => [k, 0, 0]).flat(), 500, 0, 0]);
const memberIds = Array.from({ length: 10 }, (_, k) => `M${k}`);
const ends = Int32Array.from(memberIds.flatMap((_, k) => [k, k + 1]));
const input: LabelInput = { positions, ends, memberIds, nodeIds, memberMask: null, nodeMask: null, selectedMember: -1, selectedNode: -1 };

describe("which labels are drawn", () => {
  it("labels what is in view and nothing off screen", () => {
    const { spots, inView } = labelSpots(input, viewProjection, viewport);
    expect(inView).toBe(21);
    expect(spots.map((s) => s.text)).not.toContain("FAR");
    expect(spots).toHaveLength(21);
  });

  it("keeps at most the limit, nearest the middle of the view, and always the selection", () => {
    const { spots, inView } = labelSpots({ ...input, selectedNode: 0 }, viewProjection, viewport, 3);
    expect(inView).toBe(21);
    // The middle of the view is x = 5 m: the selection first, then node N5, then a member beside it (4.5 or 5.5 m).
    expect(spots.map((s) => s.text).slice(0, 2)).toEqual(["N0", "N5"]);
    expect(["M4", "M5"]).toContain(spots[2].text);
    expect(spots).toHaveLength(3);
  });

  it("leaves out members and nodes that are not drawn", () => {
    const memberMask = new Uint8Array(10);
    memberMask[2] = 1;
    const nodeMask = new Uint8Array(12);
    const { spots } = labelSpots({ ...input, memberMask, nodeMask }, viewProjection, viewport);
    expect(spots.map((s) => s.text)).toEqual(["M2"]);
  });
});

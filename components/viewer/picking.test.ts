import { Matrix4, PerspectiveCamera, Vector3 } from "three";
import { describe, expect, it } from "vitest";
import { pickAt, projectPoint, type PickScene, type Viewport } from "./picking";

// Reference: three.js (npm), a general-purpose 3D library. Its PerspectiveCamera builds the view and projection
// matrices and Vector3.project maps a world point to normalised device coordinates; screen pixels follow the usual
// WebGL viewport mapping (x right from the left edge, y down from the top edge).
const viewport: Viewport = { width: 800, height: 600 };

function cameraAt(position: [number, number, number], target: [number, number, number]) {
  const camera = new PerspectiveCamera(40, viewport.width / viewport.height, 0.1, 1000);
  camera.up.set(0, 0, 1);
  camera.position.set(...position);
  camera.lookAt(...target);
  camera.updateMatrixWorld();
  const viewProjection = new Matrix4().multiplyMatrices(camera.projectionMatrix, camera.matrixWorldInverse);
  /** Pixel position of a world point, by three's own projection. */
  const screen = (x: number, y: number, z: number) => {
    const ndc = new Vector3(x, y, z).project(camera);
    return { x: ((ndc.x + 1) / 2) * viewport.width, y: ((1 - ndc.y) / 2) * viewport.height };
  };
  return { matrix: viewProjection.elements, screen };
}

/** Nodes and members from plain lists (members as pairs of node indices). */
function scene(nodes: [number, number, number][], members: [number, number][]): PickScene {
  return { positions: Float32Array.from(nodes.flat()), ends: Int32Array.from(members.flat()) };
}

// Invented test geometry: a 10 m chord along x at z = 0, a diagonal from (0, 4, 0) to (6, 8, 3), a node at the
// chord's far end and a lone node at (5, -4, 0).
const nodes: [number, number, number][] = [
  [0, 0, 0],
  [10, 0, 0],
  [0, 4, 0],
  [6, 8, 3],
  [5, -4, 0],
];
const members: [number, number][] = [
  [0, 1],
  [2, 3],
];
const model = scene(nodes, members);
// Plan: looking straight down, tipped by a hair so that z-up gives the screen its y direction.
const plan = cameraAt([5, 1.99, 40], [5, 2, 0]);
const iso = cameraAt([30, -25, 20], [4, 3, 1]);

describe("projection", () => {
  it("puts a model point where three's camera projects it", () => {
    for (const view of [plan, iso]) {
      for (const [x, y, z] of nodes) {
        const mine = projectPoint(view.matrix, viewport, x, y, z)!;
        const reference = view.screen(x, y, z);
        expect(mine.x).toBeCloseTo(reference.x, 3);
        expect(mine.y).toBeCloseTo(reference.y, 3);
      }
    }
  });

  it("refuses a point behind the camera", () => {
    expect(projectPoint(plan.matrix, viewport, 5, 2, 60)).toBeNull();
  });
});

describe("picking a member or node under the pointer", () => {
  it("hits a member under the pointer and returns the point on it", () => {
    const at = iso.screen(2.5, 0, 0);
    const pick = pickAt(model, iso.matrix, viewport, at);
    expect(pick?.kind).toBe("member");
    expect(pick?.index).toBe(0);
    // The point on the member is perspective-correct: the model point under the pointer, not the screen midpoint.
    expect(pick!.point[0]).toBeCloseTo(2.5, 3);
    expect(pick!.point[1]).toBeCloseTo(0, 5);
    expect(pick?.kind === "member" ? pick.t : null).toBeCloseTo(0.25, 4);
  });

  it("picks nothing on empty space (a miss clears the selection)", () => {
    // Far from every member and node: the top left corner.
    expect(pickAt(model, iso.matrix, viewport, { x: 5, y: 5 })).toBeNull();
    // Just beyond the tolerance beside the chord in plan (the chord runs along the screen's x axis).
    const chord = plan.screen(3, 0, 0);
    expect(pickAt(model, plan.matrix, viewport, { x: chord.x, y: chord.y + 6.5 }, 6)).toBeNull();
  });

  it("hits a thin member at an angle within the pixel tolerance, measured square to it on screen", () => {
    // Midpoint of the diagonal on screen, and the screen direction square to it.
    const a = iso.screen(0, 4, 0);
    const b = iso.screen(6, 8, 3);
    const mid = iso.screen(3, 6, 1.5);
    const length = Math.hypot(b.x - a.x, b.y - a.y);
    const normal = { x: -(b.y - a.y) / length, y: (b.x - a.x) / length };
    const near = { x: mid.x + normal.x * 4, y: mid.y + normal.y * 4 };
    const pick = pickAt(model, iso.matrix, viewport, near, 6);
    expect(pick?.kind).toBe("member");
    expect(pick?.index).toBe(1);
    expect(pick!.distancePx).toBeCloseTo(4, 3);
    const far = { x: mid.x + normal.x * 7, y: mid.y + normal.y * 7 };
    expect(pickAt(model, iso.matrix, viewport, far, 6)).toBeNull();
  });

  it("lets a node win over a member when both are within the tolerance", () => {
    // 3 px along the chord from its end node: the chord is at 0 px, the node at 3 px.
    const end = plan.screen(10, 0, 0);
    const pick = pickAt(model, plan.matrix, viewport, { x: end.x - 3, y: end.y }, 6);
    expect(pick).toMatchObject({ kind: "node", index: 1, point: [10, 0, 0] });
    const lone = plan.screen(5, -4, 0);
    expect(pickAt(model, plan.matrix, viewport, { x: lone.x + 2, y: lone.y })).toMatchObject({ kind: "node", index: 4 });
  });

  it("ignores members and nodes that are not drawn (filters, section box)", () => {
    const at = iso.screen(2.5, 0, 0);
    const hidden = { ...model, memberMask: Uint8Array.from([0, 1]) };
    expect(pickAt(hidden, iso.matrix, viewport, at)).toBeNull();
    const end = plan.screen(10, 0, 0);
    const noNode = { ...model, nodeMask: Uint8Array.from([1, 0, 1, 1, 1]) };
    expect(pickAt(noNode, plan.matrix, viewport, end)).toMatchObject({ kind: "member", index: 0 });
  });

  it("takes the member nearest the camera where two overlap on screen", () => {
    // Two parallel chords, one above the other: seen from above they overlap; the upper one is nearer.
    const stacked = scene(
      [
        [0, 0, 0],
        [10, 0, 0],
        [0, 0, 2],
        [10, 0, 2],
      ],
      [
        [0, 1],
        [2, 3],
      ],
    );
    const top = cameraAt([5, 0.001, 40], [5, 0, 0]);
    const at = top.screen(4, 0, 2);
    expect(pickAt(stacked, top.matrix, viewport, at)).toMatchObject({ kind: "member", index: 1 });
  });

  it("cuts a member that passes behind the camera instead of projecting its far end through it", () => {
    // A member from in front of the camera to behind it, passing 3.3 m beside it; its visible part is hit.
    const camera = cameraAt([0, -10, 2], [0, 0, 2]);
    const through = scene(
      [
        [10, 10, 2],
        [-10, -20, 2],
      ],
      [[0, 1]],
    );
    // The point of the member at y = 5 (a sixth of the way along).
    const front = camera.screen(10 - 20 / 6, 5, 2);
    const pick = pickAt(through, camera.matrix, viewport, front);
    expect(pick?.kind).toBe("member");
    // The model point under the pointer is that point, on the visible, front part of the member.
    expect(pick!.point[1]).toBeCloseTo(5, 3);
    expect(pick!.point[2]).toBeCloseTo(2, 4);
  });
});

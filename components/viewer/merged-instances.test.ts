import { BufferGeometry, Color, ConeGeometry, CylinderGeometry, Matrix4, MeshLambertMaterial, OctahedronGeometry, Quaternion, Vector3 } from "three";
import { describe, expect, it } from "vitest";
import { MergedInstances } from "./merged-instances";

// Reference: three.js itself (a general-purpose npm library). BufferGeometry.applyMatrix4 moves a shape's positions by a
// matrix and its normals by the matrix's normal matrix (inverse transpose), then normalises them: a merged copy must
// hold exactly what three.js gives for that shape moved by that matrix, with the shape's index repeated per copy.
function movedByThree(shape: () => BufferGeometry, matrix: Matrix4) {
  const moved = shape().applyMatrix4(matrix);
  const geometry = moved.index ? moved.toNonIndexed() : moved;
  return { geometry, positions: Array.from(moved.getAttribute("position").array), normals: Array.from(moved.getAttribute("normal").array) };
}

function copyOf(mesh: MergedInstances, n: number, verticesPerCopy: number) {
  const positions = Array.from(mesh.geometry.getAttribute("position").array.slice(n * verticesPerCopy * 3, (n + 1) * verticesPerCopy * 3));
  const normals = Array.from(mesh.geometry.getAttribute("normal").array.slice(n * verticesPerCopy * 3, (n + 1) * verticesPerCopy * 3));
  return { positions, normals };
}

const stretched = new Matrix4().compose(new Vector3(2, -1, 5), new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), new Vector3(1, 2, -2).normalize()), new Vector3(0.1, 3, 0.1));
const uneven = new Matrix4().compose(new Vector3(-4, 0.5, 1), new Quaternion().setFromAxisAngle(new Vector3(0, 0, 1), 2.2), new Vector3(0.35, 1.2, 0.35));

describe("many copies of a shape as one merged mesh", () => {
  const shapes: [string, () => BufferGeometry][] = [
    ["an open 3-sided prism (a member on a large roof)", () => new CylinderGeometry(1, 1, 1, 3, 1, true)],
    ["a capped cone (a load arrow's head)", () => new ConeGeometry(1, 1, 6).translate(0, -0.5, 0)],
    ["an octahedron, not indexed (a node)", () => new OctahedronGeometry(1, 0)],
  ];
  for (const [name, shape] of shapes) {
    it(`places ${name} where three.js's applyMatrix4 puts it, normals included`, () => {
      const verticesPerCopy = shape().getAttribute("position").count;
      const mesh = new MergedInstances(shape(), new MeshLambertMaterial(), 3);
      mesh.setMatrixAt(0, new Matrix4());
      mesh.setMatrixAt(1, stretched);
      mesh.setMatrixAt(2, uneven);
      for (const [n, matrix] of [[1, stretched], [2, uneven]] as const) {
        const got = copyOf(mesh, n, verticesPerCopy);
        const want = movedByThree(shape, matrix);
        got.positions.forEach((value, k) => expect(value).toBeCloseTo(want.positions[k], 5));
        got.normals.forEach((value, k) => expect(value).toBeCloseTo(want.normals[k], 5));
      }
    });
  }

  it("repeats the shape's triangles for every copy, each copy on its own vertices", () => {
    const shape = new CylinderGeometry(1, 1, 1, 3, 1, true);
    const shapeIndex = Array.from(shape.index!.array);
    const verticesPerCopy = shape.getAttribute("position").count;
    const mesh = new MergedInstances(shape, new MeshLambertMaterial(), 4);
    const index = Array.from(mesh.geometry.index!.array);
    expect(index).toHaveLength(4 * shapeIndex.length);
    expect(index.slice(2 * shapeIndex.length, 3 * shapeIndex.length)).toEqual(shapeIndex.map((v) => v + 2 * verticesPerCopy));
  });

  it("draws only the first `copies` copies, and keeps each copy's matrix", () => {
    const shape = new ConeGeometry(1, 1, 3, 1, true);
    const indicesPerCopy = shape.index!.count;
    const mesh = new MergedInstances(shape, new MeshLambertMaterial(), 10);
    expect(mesh.geometry.drawRange.count).toBe(0);
    // hidden while empty: the renderer skips it, compiling no shader for it
    expect(mesh.visible).toBe(false);
    mesh.copies = 4;
    expect(mesh.visible).toBe(true);
    expect(mesh.geometry.drawRange).toEqual({ start: 0, count: 4 * indicesPerCopy });
    mesh.copies = 50;
    expect(mesh.copies).toBe(10);
    mesh.setMatrixAt(7, uneven);
    // kept in Float32, as InstancedMesh keeps them
    mesh.getMatrixAt(7, new Matrix4()).elements.forEach((value, k) => expect(value).toBeCloseTo(uneven.elements[k], 6));
  });

  it("draws consecutive copies with each material, and gives a material with no copies no draw", () => {
    const shape = new CylinderGeometry(1, 1, 1, 3, 1, true);
    const indicesPerCopy = shape.index!.count;
    const solid = new MeshLambertMaterial();
    const faint = new MeshLambertMaterial({ transparent: true });
    const mesh = new MergedInstances(shape, [solid, faint], 10);
    expect(solid.vertexColors && faint.vertexColors).toBe(true);
    mesh.setGroups([6, 3]);
    expect(mesh.copies).toBe(9);
    expect(mesh.geometry.groups).toEqual([
      { start: 0, count: 6 * indicesPerCopy, materialIndex: 0 },
      { start: 6 * indicesPerCopy, count: 3 * indicesPerCopy, materialIndex: 1 },
    ]);
    mesh.setGroups([0, 4]);
    expect(mesh.geometry.groups).toEqual([{ start: 0, count: 4 * indicesPerCopy, materialIndex: 1 }]);
  });

  it("colours every vertex of a copy and no other copy's", () => {
    const shape = new OctahedronGeometry(1, 0);
    const verticesPerCopy = shape.getAttribute("position").count;
    const material = new MeshLambertMaterial();
    const mesh = new MergedInstances(shape, material, 3);
    mesh.setColorAt(1, new Color(0.25, 0.5, 0.75));
    const colours = Array.from(mesh.geometry.getAttribute("color").array);
    expect(colours.slice(verticesPerCopy * 3, verticesPerCopy * 6)).toEqual(Array.from({ length: verticesPerCopy }, () => [0.25, 0.5, 0.75]).flat());
    expect(colours.slice(0, verticesPerCopy * 3).every((c) => c === 0)).toBe(true);
    expect(colours.slice(verticesPerCopy * 6).every((c) => c === 0)).toBe(true);
    expect(material.vertexColors).toBe(true);
  });

  it("uploads only the drawn copies when committed", () => {
    const shape = new OctahedronGeometry(1, 0);
    const verticesPerCopy = shape.getAttribute("position").count;
    const mesh = new MergedInstances(shape, new MeshLambertMaterial(), 100);
    mesh.copies = 3;
    mesh.commit({ colours: false });
    expect(mesh.geometry.getAttribute("position")).toMatchObject({ updateRanges: [{ start: 0, count: 3 * verticesPerCopy * 3 }] });
    expect(mesh.geometry.getAttribute("color")).toMatchObject({ updateRanges: [] });
  });
});

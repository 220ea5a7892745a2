// Many copies of one small shape (members, node glyphs, load arrows) drawn as ONE plain mesh whose vertices are
// written on the CPU, instead of an InstancedMesh. Measured in headless Chromium's software renderer (issue 13,
// 60 × 60 roof): 28,800 instanced 3-sided members cost ~155 ms a frame, the same members as one merged mesh ~2 ms;
// instancing there costs per instance, whatever the triangle count. A real GPU draws either in one call.
// Own code because three.js has no such class: BatchedMesh draws each instance as its own multi-draw entry, and
// BufferGeometryUtils.mergeGeometries builds a new geometry per change (allocating), where a result switch must
// rewrite ~30,000 copies in place.
import { BufferAttribute, BufferGeometry, DynamicDrawUsage, Mesh, type Color, type Material, type Matrix4 } from "three";

/**
 * The first `copies` copies of `shape` are drawn; copy n is placed by its matrix (setMatrixAt / placeFromMatrices)
 * and coloured by setColorAt (the material must use vertex colours; the constructor turns them on). With several
 * materials, setGroups says how many consecutive copies each draws. Call commit() after writing so the changed part
 * is uploaded.
 */
export class MergedInstances extends Mesh<BufferGeometry, Material | Material[]> {
  readonly capacity: number;
  /** Column-major 4 × 4 matrix per copy, as InstancedMesh keeps them: writers may fill it and call placeFromMatrices. */
  readonly matrices: Float32Array;
  private readonly shapePositions: Float32Array;
  private readonly shapeNormals: Float32Array;
  private readonly verticesPerCopy: number;
  private readonly indicesPerCopy: number;
  private readonly positions: Float32Array;
  private readonly normals: Float32Array;
  private readonly colours: Float32Array;
  private shown = 0;

  constructor(shape: BufferGeometry, material: Material | Material[], capacity: number) {
    const size = Math.max(1, capacity);
    const shapePositions = Float32Array.from(shape.getAttribute("position").array);
    if (!shape.getAttribute("normal")) shape.computeVertexNormals();
    const shapeNormals = Float32Array.from(shape.getAttribute("normal").array);
    const verticesPerCopy = shapePositions.length / 3;
    const shapeIndex = shape.index ? Array.from(shape.index.array) : Array.from({ length: verticesPerCopy }, (_, v) => v);
    const indicesPerCopy = shapeIndex.length;
    const Index = size * verticesPerCopy > 65_535 ? Uint32Array : Uint16Array;
    const index = new Index(size * indicesPerCopy);
    for (let n = 0; n < size; n += 1) {
      const first = n * verticesPerCopy;
      for (let q = 0; q < indicesPerCopy; q += 1) index[n * indicesPerCopy + q] = shapeIndex[q] + first;
    }
    const positions = new Float32Array(size * verticesPerCopy * 3);
    const normals = new Float32Array(size * verticesPerCopy * 3);
    const colours = new Float32Array(size * verticesPerCopy * 3);
    const merged = new BufferGeometry();
    merged.setIndex(new BufferAttribute(index, 1));
    merged.setAttribute("position", new BufferAttribute(positions, 3).setUsage(DynamicDrawUsage));
    merged.setAttribute("normal", new BufferAttribute(normals, 3).setUsage(DynamicDrawUsage));
    merged.setAttribute("color", new BufferAttribute(colours, 3).setUsage(DynamicDrawUsage));
    for (const each of [material].flat()) each.vertexColors = true;
    super(merged, material);
    shape.dispose();
    this.capacity = size;
    this.matrices = new Float32Array(size * 16);
    this.shapePositions = shapePositions;
    this.shapeNormals = shapeNormals;
    this.verticesPerCopy = verticesPerCopy;
    this.indicesPerCopy = indicesPerCopy;
    this.positions = positions;
    this.normals = normals;
    this.colours = colours;
    // The copies are spread over the whole model: never culled as one object.
    this.frustumCulled = false;
    this.copies = 0;
  }

  /** How many copies are drawn (the first slots). Not Mesh.count, which three.js keeps for instancing elsewhere. */
  get copies(): number {
    return this.shown;
  }

  set copies(value: number) {
    this.shown = Math.min(Math.max(0, value), this.capacity);
    this.geometry.setDrawRange(0, this.shown * this.indicesPerCopy);
    // hidden when empty: three.js would still compile its shader to draw nothing
    this.visible = this.shown > 0;
  }

  /**
   * Draws the first counts[0] copies with the first material, the next counts[1] with the second, and so on (a
   * material with no copies gets no draw call, and so no shader). Sets `copies` to their sum.
   */
  setGroups(counts: readonly number[]): void {
    this.geometry.clearGroups();
    let first = 0;
    counts.forEach((count, materialIndex) => {
      if (count > 0) this.geometry.addGroup(first * this.indicesPerCopy, count * this.indicesPerCopy, materialIndex);
      first += count;
    });
    this.copies = first;
  }

  /** Places copy n by a matrix. */
  setMatrixAt(n: number, matrix: Matrix4): void {
    this.matrices.set(matrix.elements, n * 16);
    this.placeFromMatrices(n);
  }

  /** Reads copy n's matrix into `matrix`. */
  getMatrixAt(n: number, matrix: Matrix4): Matrix4 {
    return matrix.fromArray(this.matrices, n * 16);
  }

  /**
   * Writes copy n's vertices from its matrix in `matrices`: positions by the matrix, normals by its cofactor matrix
   * (the inverse transpose up to a positive factor; normalised here), so stretched shapes keep true normals.
   */
  placeFromMatrices(n: number): void {
    const e = this.matrices;
    const o = n * 16;
    const m0 = e[o];
    const m1 = e[o + 1];
    const m2 = e[o + 2];
    const m4 = e[o + 4];
    const m5 = e[o + 5];
    const m6 = e[o + 6];
    const m8 = e[o + 8];
    const m9 = e[o + 9];
    const m10 = e[o + 10];
    const tx = e[o + 12];
    const ty = e[o + 13];
    const tz = e[o + 14];
    // Cofactors of the upper 3 × 3 (columns a = (m0, m1, m2), b = (m4, m5, m6), c = (m8, m9, m10)): b × c, c × a, a × b.
    const c0 = m5 * m10 - m6 * m9;
    const c1 = m6 * m8 - m4 * m10;
    const c2 = m4 * m9 - m5 * m8;
    const c4 = m9 * m2 - m10 * m1;
    const c5 = m10 * m0 - m8 * m2;
    const c6 = m8 * m1 - m9 * m0;
    const c8 = m1 * m6 - m2 * m5;
    const c9 = m2 * m4 - m0 * m6;
    const c10 = m0 * m5 - m1 * m4;
    const sp = this.shapePositions;
    const sn = this.shapeNormals;
    const p = this.positions;
    const q = this.normals;
    let w = n * this.verticesPerCopy * 3;
    for (let v = 0; v < sp.length; v += 3, w += 3) {
      const x = sp[v];
      const y = sp[v + 1];
      const z = sp[v + 2];
      p[w] = m0 * x + m4 * y + m8 * z + tx;
      p[w + 1] = m1 * x + m5 * y + m9 * z + ty;
      p[w + 2] = m2 * x + m6 * y + m10 * z + tz;
      const nx = sn[v];
      const ny = sn[v + 1];
      const nz = sn[v + 2];
      // Row k of the inverse transpose is cofactor column k: n' = C·n with C's columns (c0,c1,c2), (c4,c5,c6), (c8,c9,c10).
      const rx = c0 * nx + c4 * ny + c8 * nz;
      const ry = c1 * nx + c5 * ny + c9 * nz;
      const rz = c2 * nx + c6 * ny + c10 * nz;
      // (Math.sqrt, not Math.hypot: several times faster, and a result switch places ~30,000 members)
      const length = Math.sqrt(rx * rx + ry * ry + rz * rz) || 1;
      q[w] = rx / length;
      q[w + 1] = ry / length;
      q[w + 2] = rz / length;
    }
  }

  /** Colours every vertex of copy n. */
  setColorAt(n: number, colour: Color): void {
    this.setRgbAt(n, colour.r, colour.g, colour.b);
  }

  setRgbAt(n: number, r: number, g: number, b: number): void {
    const c = this.colours;
    const end = (n + 1) * this.verticesPerCopy * 3;
    for (let w = n * this.verticesPerCopy * 3; w < end; w += 3) {
      c[w] = r;
      c[w + 1] = g;
      c[w + 2] = b;
    }
  }

  /** Uploads the drawn copies' places (and colours) on the next frame. */
  commit({ places = true, colours = true }: { places?: boolean; colours?: boolean } = {}): void {
    const floats = this.shown * this.verticesPerCopy * 3;
    const names = [...(places ? ["position", "normal"] : []), ...(colours ? ["color"] : [])];
    for (const name of names) {
      const attribute = this.geometry.getAttribute(name) as BufferAttribute;
      attribute.clearUpdateRanges();
      attribute.addUpdateRange(0, floats);
      attribute.needsUpdate = true;
    }
  }

  /** Frees the GPU buffers and the material(s). */
  dispose(): void {
    this.geometry.dispose();
    for (const each of [this.material].flat()) each.dispose();
  }
}

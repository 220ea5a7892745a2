import { assembleStiffness, type AssembledStiffness } from "./assemble";
import type { TrussModel } from "./model";
import { freeNow } from "./sparse/free-now";
import { solveSupernodalMany } from "./sparse/solve-many";
import { factorSupernodal, solveSupernodal, type SupernodalFactor } from "./sparse/supernodal";
import { analyzePattern, canReuse, type SymbolicAnalysis } from "./symbolic";
import { buildTopology, type Topology } from "./topology";
import { unitLoadForces, type UnitLoadBlock } from "./unit-load-forces";

export type Direction = "ux" | "uy" | "uz";
export type Instability = { node: string; directions: Direction[] };

/**
 * A pivot below this fraction of its node's largest diagonal stiffness marks a mechanism. Exact mechanisms
 * leave pivots near 1e-16 of the scale (rounding); a joint between members kinked by less than ~1e-5 rad
 * (stiffness ~ angle squared) is reported as near-singular too.
 */
export const PIVOT_TOLERANCE = 1e-10;

export const directions: readonly Direction[] = ["ux", "uy", "uz"];

/**
 * Right-hand sides solved together by solveColumns: enough to load each entry of L once for many columns,
 * few enough that the block of X (equations x 64 doubles, 44 MB on a 120 x 120 grid) stays modest. The 60 x 60
 * certificate workload (bench:solver) projected 25-28 CPU s with 64, 33 s with 32, 27-28 s with 96 and 128
 * (interleaved runs, load average 20).
 */
export const SOLVE_BLOCK = 64;

/** One assembled and factored structure: every load vector is solved against the same factor. */
export type PreparedStructure = {
  status: "ok" | "unstable";
  instability: Instability[];
  nodeIds: string[];
  memberIds: string[];
  topology: Topology;
  /** Full 3n nodal load vector in (kN), full 3n displacement vector out (m), zeros at restraints. */
  solve(f: Float64Array): Float64Array;
  /** Several load vectors at once (one pass over the factor; use it for influence or what-if batches). */
  solveMany(fs: Float64Array[]): Float64Array[];
  /**
   * Many load vectors at once for influence and certificate work: `count` full 3n vectors stored one after
   * another in `fs` (column c is fs[c * 3n .. (c + 1) * 3n)); returns the displacements in the same layout.
   * Columns are solved SOLVE_BLOCK at a time through one pass over the factor. Unit loads batched by nearby
   * `eliminationOrder` positions share most of their forward solve, which then skips untouched supernodes.
   */
  solveColumns(fs: Float64Array, count: number): Float64Array;
  /**
   * Member forces under a unit load at each of `loadDofs` (global dofs), SOLVE_BLOCK loads per pass, one block
   * per step (unit-load-forces.ts): the certificate workload. Give the dofs in elimination order of their nodes
   * so that each block shares its forward solve.
   */
  unitLoadForces(loadDofs: Int32Array): Generator<UnitLoadBlock, void>;
  /** Node indices in elimination order (the fill-reducing order the factor uses). */
  eliminationOrder: Int32Array;
  /** Axial forces N (kN, tension positive) from a full displacement vector. */
  memberForces(u: Float64Array): Float64Array;
  /** b_e (full 3n) with N_e = b_e . u; for adjoint solves K z = b_e (influence of loads on member e). */
  memberForceVector(memberIndex: number): Float64Array;
  /** Reactions (full 3n, non-zero only at restrained dofs) R = K u - f. */
  reactions(u: Float64Array, f: Float64Array): Float64Array;
  /** Internal nodal forces K u (full 3n), summed member by member from the member forces. */
  internalForces(u: Float64Array): Float64Array;
  /**
   * Drops the factor (the largest allocation, ~100 MB on a 120 x 120 grid) once no more solves are needed and
   * gives its memory back at once (freeNow), so that building results does not hold it; solves afterwards throw.
   */
  release(): void;
  /**
   * The smallest pivot kept (not flagged) against its node's diagonal stiffness, and its dof: near 1e-9 a joint
   * is held only by a nearly weightless member (nearly a mechanism); null when no pivot was kept.
   */
  smallestPivot: { ratio: number; dof: number } | null;
  stats: { dofs: number; equations: number; nonzerosK: number; nonzerosL: number };
  /** The ordering and supernode structure, to pass to prepareStructure for a structure of the same pattern. */
  symbolic: SymbolicAnalysis;
  /** Whether this structure reused the symbolic analysis it was given. */
  symbolicReused: boolean;
  /** Milliseconds spent in each step (assembly includes the symbolic analysis). */
  timings: { assembly: number; ordering: number; factorisation: number };
};

const now = () => globalThis.performance.now();

/**
 * Orders, assembles and factors the stiffness matrix of a validated model. With `options.symbolic` from an
 * earlier structure whose pattern contains this one's (same nodes and restraints, no new node pairs), the
 * ordering and symbolic analysis are reused and only assembly and numeric factorisation run.
 */
export function prepareStructure(model: TrussModel, options: { symbolic?: SymbolicAnalysis } = {}): PreparedStructure {
  const t0 = now();
  const topology = buildTopology(model);
  const t1 = now();
  const n = topology.nodeIds.length;
  const reused = options.symbolic !== undefined && canReuse(options.symbolic, topology);
  let symbolic: SymbolicAnalysis;
  let assembled: AssembledStiffness;
  let orderingMs = 0;
  if (reused) {
    symbolic = options.symbolic!;
    assembled = assembleStiffness(topology, symbolic.nodeOrder);
  } else {
    ({ symbolic, assembled, orderingMs } = analyzePattern(topology));
  }
  const nodeOrder = symbolic.nodeOrder;
  const t3 = now();
  let factor: SupernodalFactor | undefined = factorSupernodal(assembled.matrix, symbolic.structure, assembled.pivotScale, PIVOT_TOLERANCE);
  const t4 = now();

  const { dofOfEquation, equationOfDof } = assembled;
  const byNode = new Map<number, Direction[]>();
  for (const eq of factor.tinyPivots) {
    const dof = dofOfEquation[eq];
    const node = Math.floor(dof / 3);
    const list = byNode.get(node) ?? [];
    list.push(directions[dof % 3]);
    byNode.set(node, list);
  }
  const instability = [...byNode.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([node, dirs]) => ({ node: topology.nodeIds[node], directions: dirs.sort() }));

  let smallestPivot: PreparedStructure["smallestPivot"] = null;
  for (let q = 0; q < factor.inversePivot.length; q++) {
    const inverse = factor.inversePivot[q];
    if (inverse === 0) continue;
    const ratio = 1 / inverse / assembled.pivotScale[q];
    if (!smallestPivot || ratio < smallestPivot.ratio) smallestPivot = { ratio, dof: dofOfEquation[q] };
  }

  const factored = () => {
    if (!factor) throw new Error("the factor of this structure was released");
    return factor;
  };

  const { memberI, memberJ, direction: c, axialStiffness: ks } = topology;
  const m = topology.memberIds.length;
  const neq = assembled.matrix.n;

  const memberForces = (u: Float64Array) => {
    const forces = new Float64Array(m);
    for (let e = 0; e < m; e++) {
      const a = 3 * memberI[e];
      const b = 3 * memberJ[e];
      const ce = 3 * e;
      forces[e] = ks[e] * (c[ce] * (u[b] - u[a]) + c[ce + 1] * (u[b + 1] - u[a + 1]) + c[ce + 2] * (u[b + 2] - u[a + 2]));
    }
    return forces;
  };
  const internalForces = (u: Float64Array) => {
    const r = new Float64Array(3 * n);
    const forces = memberForces(u);
    for (let e = 0; e < m; e++) {
      const a = 3 * memberI[e];
      const b = 3 * memberJ[e];
      for (let s = 0; s < 3; s++) {
        const v = forces[e] * c[3 * e + s];
        r[a + s] -= v;
        r[b + s] += v;
      }
    }
    return r;
  };

  return {
    status: instability.length === 0 ? "ok" : "unstable",
    instability,
    nodeIds: topology.nodeIds,
    memberIds: topology.memberIds,
    topology,
    solve(f) {
      const x = new Float64Array(neq);
      for (let q = 0; q < neq; q++) x[q] = f[dofOfEquation[q]];
      solveSupernodal(factored(), x);
      const u = new Float64Array(3 * n);
      for (let q = 0; q < neq; q++) u[dofOfEquation[q]] = x[q];
      return u;
    },
    solveMany(fs) {
      const count = fs.length;
      const x = new Float64Array(neq * count);
      for (let q = 0; q < neq; q++) for (let c = 0; c < count; c++) x[q * count + c] = fs[c][dofOfEquation[q]];
      solveSupernodalMany(factored(), x, count);
      return fs.map((_, c) => {
        const u = new Float64Array(3 * n);
        for (let q = 0; q < neq; q++) u[dofOfEquation[q]] = x[q * count + c];
        return u;
      });
    },
    solveColumns(fs, count) {
      const dofs = 3 * n;
      if (fs.length !== dofs * count) throw new Error(`solveColumns: expected ${count} vectors of ${dofs} values`);
      const out = new Float64Array(dofs * count);
      const block = Math.min(SOLVE_BLOCK, count);
      const x = new Float64Array(neq * block);
      for (let first = 0; first < count; first += block) {
        const width = Math.min(block, count - first);
        for (let q = 0; q < neq; q++) {
          const dof = dofOfEquation[q];
          for (let c = 0; c < width; c++) x[q * width + c] = fs[(first + c) * dofs + dof];
        }
        solveSupernodalMany(factored(), x, width);
        for (let q = 0; q < neq; q++) {
          const dof = dofOfEquation[q];
          for (let c = 0; c < width; c++) out[(first + c) * dofs + dof] = x[q * width + c];
        }
      }
      return out;
    },
    unitLoadForces: (loadDofs) => unitLoadForces(factored, topology, equationOfDof, loadDofs, SOLVE_BLOCK),
    eliminationOrder: nodeOrder,
    memberForces,
    memberForceVector(e) {
      const b = new Float64Array(3 * n);
      for (let s = 0; s < 3; s++) {
        const v = ks[e] * c[3 * e + s];
        b[3 * memberI[e] + s] -= v;
        b[3 * memberJ[e] + s] += v;
      }
      return b;
    },
    reactions(u, f) {
      const r = internalForces(u);
      for (let dof = 0; dof < 3 * n; dof++) r[dof] = topology.restrained[dof] ? r[dof] - f[dof] : 0;
      return r;
    },
    internalForces,
    symbolic,
    symbolicReused: reused,
    release() {
      if (factor) freeNow(factor.values, factor.inversePivot); // its own arrays; the symbolic structure is kept for reuse
      factor = undefined;
    },
    smallestPivot,
    stats: { dofs: 3 * n, equations: neq, nonzerosK: assembled.matrix.colPtr[neq], nonzerosL: symbolic.nnzL },
    timings: { assembly: t3 - t1 - orderingMs + (t1 - t0), ordering: orderingMs, factorisation: t4 - t3 },
  };
}

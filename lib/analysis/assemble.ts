import type { UpperCsc } from "./sparse/ldl";
import type { Topology } from "./topology";

/** The free-dof stiffness matrix in elimination order, with the maps between equations and nodal dofs. */
export type AssembledStiffness = {
  matrix: UpperCsc;
  /** Global dof (3 * node + direction) of each equation. */
  dofOfEquation: Int32Array;
  /** Equation of each global dof, -1 where restrained. */
  equationOfDof: Int32Array;
  /** Largest diagonal stiffness among each equation's node dofs: the yardstick for tiny pivots. */
  pivotScale: Float64Array;
};

/**
 * Assembles the upper triangle of K_ff (restrained dofs eliminated) directly in the order given by
 * `nodeOrder`: each node's free dofs become consecutive equations, so the node ordering is the dof ordering.
 * A member adds k c c^T to the diagonal blocks of its two nodes and -k c c^T to the block joining them.
 */
export function assembleStiffness(t: Topology, nodeOrder: Int32Array): AssembledStiffness {
  const n = t.nodeIds.length;
  const m = t.memberIds.length;
  const { direction: c, axialStiffness: ks, restrained, adjStart, adj, adjMember } = t;

  const diag = new Float64Array(9 * n);
  for (let e = 0; e < m; e++) {
    const k = ks[e];
    const a = 9 * t.memberI[e];
    const b = 9 * t.memberJ[e];
    for (let s = 0; s < 3; s++) {
      const ks_ = k * c[3 * e + s];
      for (let r = 0; r < 3; r++) {
        const v = ks_ * c[3 * e + r];
        diag[a + 3 * s + r] += v;
        diag[b + 3 * s + r] += v;
      }
    }
  }

  const position = new Int32Array(n);
  for (let p = 0; p < n; p++) position[nodeOrder[p]] = p;
  const equationOfDof = new Int32Array(3 * n).fill(-1);
  const firstEquation = new Int32Array(n);
  const freeCount = new Int32Array(n);
  let neq = 0;
  for (let p = 0; p < n; p++) {
    const a = nodeOrder[p];
    firstEquation[a] = neq;
    for (let r = 0; r < 3; r++) if (!restrained[3 * a + r]) equationOfDof[3 * a + r] = neq++;
    freeCount[a] = neq - firstEquation[a];
  }
  const dofOfEquation = new Int32Array(neq);
  for (let dof = 0; dof < 3 * n; dof++) if (equationOfDof[dof] >= 0) dofOfEquation[equationOfDof[dof]] = dof;

  // Column counts: free dofs of earlier-ordered neighbours, then the node's own dofs up to the diagonal.
  const colPtr = new Int32Array(neq + 1);
  for (let a = 0; a < n; a++) {
    let upper = 0;
    for (let q = adjStart[a]; q < adjStart[a + 1]; q++) if (position[adj[q]] < position[a]) upper += freeCount[adj[q]];
    for (let s = 0; s < freeCount[a]; s++) colPtr[firstEquation[a] + s + 1] = upper + s + 1;
  }
  for (let j = 0; j < neq; j++) colPtr[j + 1] += colPtr[j];
  const rowIdx = new Int32Array(colPtr[neq]);
  const values = new Float64Array(colPtr[neq]);

  let maxDegree = 0;
  for (let a = 0; a < n; a++) maxDegree = Math.max(maxDegree, adjStart[a + 1] - adjStart[a]);
  const nbNode = new Int32Array(maxDegree);
  const nbMember = new Int32Array(maxDegree);
  const localDir = new Int32Array(3);
  for (let a = 0; a < n; a++) {
    const fa = freeCount[a];
    if (fa === 0) continue;
    let count = 0;
    for (let q = adjStart[a]; q < adjStart[a + 1]; q++) {
      const b = adj[q];
      if (position[b] >= position[a]) continue;
      // insertion sort by elimination position keeps row indices ascending
      let h = count++;
      while (h > 0 && position[nbNode[h - 1]] > position[b]) {
        nbNode[h] = nbNode[h - 1];
        nbMember[h] = nbMember[h - 1];
        h--;
      }
      nbNode[h] = b;
      nbMember[h] = adjMember[q];
    }
    let f = 0;
    for (let r = 0; r < 3; r++) if (!restrained[3 * a + r]) localDir[f++] = r;
    for (let s = 0; s < fa; s++) {
      const col = firstEquation[a] + s;
      const dirA = localDir[s];
      let p = colPtr[col];
      for (let h = 0; h < count; h++) {
        const b = nbNode[h];
        const e = nbMember[h];
        const kc = -ks[e] * c[3 * e + dirA];
        for (let r = 0; r < 3; r++) {
          const eq = equationOfDof[3 * b + r];
          if (eq < 0) continue;
          rowIdx[p] = eq;
          values[p++] = kc * c[3 * e + r];
        }
      }
      for (let r = 0; r <= s; r++) {
        rowIdx[p] = firstEquation[a] + r;
        values[p++] = diag[9 * a + 3 * localDir[r] + dirA];
      }
    }
  }

  const pivotScale = new Float64Array(neq);
  for (let a = 0; a < n; a++) {
    let big = 0;
    for (let r = 0; r < 3; r++) big = Math.max(big, Math.abs(diag[9 * a + 4 * r]));
    for (let s = 0; s < freeCount[a]; s++) pivotScale[firstEquation[a] + s] = big;
  }
  return { matrix: { n: neq, colPtr, rowIdx, values }, dofOfEquation, equationOfDof, pivotScale };
}

/**
 * Approximate minimum degree ordering of a symmetric sparsity graph.
 *
 * Written here because no npm package offers a fill-reducing ordering for our sparse SPD solver (see ldl.ts).
 * Follows the published algorithm: P. R. Amestoy, T. A. Davis, I. S. Duff, "An approximate minimum degree
 * ordering algorithm", SIAM J. Matrix Anal. Appl. 17(4), 1996: a quotient graph of variables and elements,
 * element absorption (including aggressive absorption of elements contained in the new element), the
 * approximate external degree bound d_i = min(n_left - |i|, d_i_old + |Lp \ i|, |A_i \ i| + |Lp \ i| +
 * sum_e |Le \ Lp|), and supervariable detection by hashing (which also performs mass elimination of variables
 * whose only neighbour is the new element). Dense-row handling is omitted: truss graphs have bounded degree.
 *
 * The solver orders the node graph (one vertex per joint, three dofs each), which keeps the quotient graph
 * small; per-variable adjacency lives in plain arrays because the graph has only a few thousand vertices.
 */
export function approximateMinimumDegree(n: number, adjStart: Int32Array, adj: Int32Array): Int32Array {
  const VARIABLE = 0;
  const ELEMENT = 1;
  const GONE = 2; // absorbed element or non-principal variable
  const status = new Uint8Array(n);
  const weight = new Int32Array(n).fill(1); // supervariable size; 0 once merged into another
  const degree = new Int32Array(n);
  const varAdj: number[][] = new Array(n);
  const elAdj: number[][] = new Array(n);
  const elVars: number[][] = new Array(n);
  const elSize = new Int32Array(n);
  const svNext = new Int32Array(n).fill(-1); // chain of variables merged into a principal variable
  const svTail = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const list: number[] = [];
    for (let p = adjStart[i]; p < adjStart[i + 1]; p++) if (adj[p] !== i) list.push(adj[p]);
    varAdj[i] = list;
    elAdj[i] = [];
    degree[i] = list.length;
    svTail[i] = i;
  }

  // Degree buckets: doubly linked lists, head[d] = first variable of degree d.
  const head = new Int32Array(n + 1).fill(-1);
  const next = new Int32Array(n).fill(-1);
  const prev = new Int32Array(n).fill(-1);
  const insert = (v: number) => {
    const d = degree[v];
    prev[v] = -1;
    next[v] = head[d];
    if (head[d] !== -1) prev[head[d]] = v;
    head[d] = v;
  };
  const remove = (v: number) => {
    if (prev[v] !== -1) next[prev[v]] = next[v];
    else head[degree[v]] = next[v];
    if (next[v] !== -1) prev[next[v]] = prev[v];
  };
  for (let i = 0; i < n; i++) insert(i);

  const mark = new Int32Array(n); // stamp: member of the new element's variable list
  const wStamp = new Int32Array(n); // stamp: w[e] valid for this step
  const w = new Int32Array(n); // |Le \ Lp| (weighted)
  const hash = new Float64Array(n);
  const order = new Int32Array(n);
  let ordered = 0;
  let eliminated = 0;
  let minDegree = 0;
  let step = 0;

  while (eliminated < n) {
    while (minDegree < n && head[minDegree] === -1) minDegree++;
    const p = head[minDegree];
    remove(p);
    step++;
    mark[p] = step;

    // New element p: union of the variables of its adjacent elements and its adjacent variables.
    const lp: number[] = [];
    let lpWeight = 0;
    for (const e of elAdj[p]) {
      if (status[e] !== ELEMENT) continue;
      for (const v of elVars[e]) {
        if (weight[v] > 0 && status[v] === VARIABLE && mark[v] !== step) {
          mark[v] = step;
          lp.push(v);
          lpWeight += weight[v];
        }
      }
      status[e] = GONE; // absorbed into p
      elVars[e] = [];
    }
    for (const v of varAdj[p]) {
      if (weight[v] > 0 && status[v] === VARIABLE && mark[v] !== step) {
        mark[v] = step;
        lp.push(v);
        lpWeight += weight[v];
      }
    }
    status[p] = ELEMENT;
    varAdj[p] = [];
    elAdj[p] = [];
    eliminated += weight[p];
    for (let v = p; v !== -1; v = svNext[v]) order[ordered++] = v;

    // w[e] = |Le \ Lp| for every live element touching Lp.
    for (const v of lp) {
      remove(v);
      for (const e of elAdj[v]) {
        if (status[e] !== ELEMENT) continue;
        if (wStamp[e] !== step) {
          wStamp[e] = step;
          w[e] = elSize[e];
        }
        w[e] -= weight[v];
      }
    }

    const left = n - eliminated;
    for (const v of lp) {
      const wv = weight[v];
      let h = p;
      let external = 0;
      const keptEl: number[] = [p];
      for (const e of elAdj[v]) {
        if (status[e] !== ELEMENT || e === p) continue;
        if (w[e] <= 0) {
          status[e] = GONE; // aggressive absorption: Le is inside Lp
          elVars[e] = [];
          continue;
        }
        keptEl.push(e);
        external += w[e];
        h += e;
      }
      elAdj[v] = keptEl;
      let varWeight = 0;
      const keptVar: number[] = [];
      for (const u of varAdj[v]) {
        if (weight[u] === 0 || status[u] !== VARIABLE || mark[u] === step) continue;
        keptVar.push(u);
        varWeight += weight[u];
        h += u;
      }
      varAdj[v] = keptVar;
      const lpOthers = lpWeight - wv;
      degree[v] = Math.max(0, Math.min(left - wv, degree[v] + lpOthers, varWeight + lpOthers + external));
      hash[v] = h;
    }

    // Supervariables: variables of Lp with identical adjacency merge (this also mass-eliminates the ones
    // whose only neighbour is p: they all hash alike and compare equal).
    // Sorting by hash keeps the pairwise comparisons inside groups of equal hash.
    const byHash = lp.slice().sort((x, y) => hash[x] - hash[y]);
    for (let a = 0; a < byHash.length; a++) {
      const i = byHash[a];
      if (weight[i] === 0) continue;
      for (let b = a + 1; b < byHash.length && hash[byHash[b]] === hash[i]; b++) {
        const j = byHash[b];
        if (weight[j] === 0 || !sameSet(elAdj[i], elAdj[j]) || !sameSet(varAdj[i], varAdj[j])) continue;
        degree[i] = Math.max(0, degree[i] - weight[j]);
        weight[i] += weight[j];
        weight[j] = 0;
        status[j] = GONE;
        svNext[svTail[i]] = j;
        svTail[i] = svTail[j];
        varAdj[j] = [];
        elAdj[j] = [];
      }
    }

    const members: number[] = [];
    for (const v of lp) {
      if (weight[v] === 0) continue;
      members.push(v);
      degree[v] = Math.min(degree[v], left - weight[v]);
      insert(v);
      if (degree[v] < minDegree) minDegree = degree[v];
    }
    elVars[p] = members;
    elSize[p] = lpWeight;
  }
  return order;
}

function sameSet(a: number[], b: number[]): boolean {
  if (a.length !== b.length) return false;
  // Lists are short (a few entries per vertex), so a quadratic check beats building a set.
  for (const x of a) if (!b.includes(x)) return false;
  return true;
}

import { approximateMinimumDegree } from "./amd";

/**
 * Geometric nested dissection of the node graph, with minimum degree on the leaves (our own code: no npm
 * package orders a sparse matrix; METIS-style graph partitioners are native libraries).
 *
 * Method (A. George, "Nested dissection of a regular finite element mesh", SIAM J. Numer. Anal. 10, 1973;
 * G. L. Miller, S.-H. Teng, W. Thurston, S. A. Vavasis, "Geometric separators for finite-element meshes",
 * SIAM J. Sci. Comput. 19, 1998): split the nodes by a plane, take the nodes on one side that touch the
 * other side as the separator, order both halves recursively and the separator last. The plane is normal to
 * a coordinate axis or a plan diagonal (a double-layer grid separates most cheaply along its diagonals), at
 * the position that minimises |S|^2 / (|A| |B|) within the middle 40 % of the nodes; the boundary sizes of
 * every cut position along one direction follow from one difference-array pass over the part, kept sorted
 * along each direction from a single sort at the start. Disconnected parts are ordered one after another
 * with no separator. Parts of at most `leafSize` nodes are ordered by minimum degree with their halo.
 */
export function nestedDissection(n: number, adjStart: Int32Array, adj: Int32Array, coords: Float64Array, leafSize = 64): Int32Array {
  const order = new Int32Array(n);
  const inPart = new Int32Array(n).fill(-1); // stamp: the part currently being split
  const side = new Int32Array(n); // which child a node of the part goes to
  const local = new Int32Array(n); // position of a node in the list being examined
  const keys = directions.map(([dx, dy, dz]) => {
    const key = new Float64Array(n);
    for (let v = 0; v < n; v++) key[v] = dx * coords[3 * v] + dy * coords[3 * v + 1] + dz * coords[3 * v + 2];
    return key;
  });
  const all = Int32Array.from({ length: n }, (_, v) => v);
  const boundary = { left: new Int32Array(n + 1), right: new Int32Array(n + 1) };
  let stamp = 0;

  // Each task orders its nodes (listed sorted along every direction) into order[lo .. lo + count).
  const tasks: { sorted: Int32Array[]; lo: number }[] = [{ sorted: keys.map((key) => sortByKey(all, key)), lo: 0 }];
  while (tasks.length > 0) {
    const { sorted, lo } = tasks.pop()!;
    const nodes = sorted[0];
    const k = nodes.length;
    if (k === 0) continue;
    stamp++;
    for (const v of nodes) inPart[v] = stamp;

    const parts = componentsOf(nodes, adjStart, adj, inPart, stamp, side);
    if (parts > 1) {
      let at = lo;
      for (const child of split(sorted, side, parts)) {
        tasks.push({ sorted: child, lo: at });
        at += child[0].length;
      }
      continue;
    }
    const cut = k > leafSize ? bestCut(sorted, keys, adjStart, adj, inPart, stamp, local, boundary) : undefined;
    if (!cut) {
      orderLeaf(nodes, lo, order, adjStart, adj, inPart, stamp, local);
      continue;
    }
    // side 0 and 1: the two halves; 2: the separator (the chosen side's nodes with a neighbour across).
    const list = sorted[cut.direction];
    for (let p = 0; p < k; p++) local[list[p]] = p;
    for (let p = 0; p < k; p++) {
      const v = list[p];
      const left = p < cut.position;
      side[v] = left ? 0 : 1;
      if (left !== (cut.separatorSide === 0)) continue;
      for (let q = adjStart[v]; q < adjStart[v + 1]; q++) {
        const u = adj[q];
        if (inPart[u] === stamp && local[u] < cut.position !== left) {
          side[v] = 2;
          break;
        }
      }
    }
    const [a, b, s] = split(sorted, side, 3);
    order.set(s[cut.direction], lo + k - s[0].length); // eliminated last, in order along the cut
    tasks.push({ sorted: a, lo });
    tasks.push({ sorted: b, lo: lo + a[0].length });
  }
  return order;
}

/**
 * The nodes sorted by key, ties by index. The keys are sorted natively (no comparator calls, several times
 * faster than sorting indices with one) and each node then finds its place by binary search.
 */
function sortByKey(nodes: Int32Array, key: Float64Array): Int32Array {
  const k = nodes.length;
  const sortedKeys = new Float64Array(k);
  for (let p = 0; p < k; p++) sortedKeys[p] = key[nodes[p]];
  sortedKeys.sort();
  const taken = new Int32Array(k); // nodes already placed in the group of equal keys starting here
  const out = new Int32Array(k);
  const byIndex = nodes.slice().sort();
  for (const v of byIndex) {
    const value = key[v];
    let low = 0;
    let high = k;
    while (low < high) {
      const mid = (low + high) >>> 1;
      if (sortedKeys[mid] < value) low = mid + 1;
      else high = mid;
    }
    out[low + taken[low]++] = v;
  }
  return out;
}

/** The part's lists divided by `side` (0 .. count - 1), each keeping its order. */
function split(sorted: Int32Array[], side: Int32Array, count: number): Int32Array[][] {
  const sizes = new Int32Array(count);
  for (const v of sorted[0]) sizes[side[v]]++;
  const out = Array.from({ length: count }, (_, c) => sorted.map(() => new Int32Array(sizes[c])));
  const fill = new Int32Array(count);
  for (let d = 0; d < sorted.length; d++) {
    const list = sorted[d];
    fill.fill(0);
    for (let p = 0; p < list.length; p++) {
      const v = list[p];
      const c = side[v];
      out[c][d][fill[c]++] = v;
    }
  }
  return out;
}

/** Labels the connected components of the part (nodes stamped `stamp`) in `side`; returns their number. */
function componentsOf(nodes: Int32Array, adjStart: Int32Array, adj: Int32Array, inPart: Int32Array, stamp: number, side: Int32Array): number {
  const queue = new Int32Array(nodes.length);
  const seen = -stamp - 1; // a second stamp value marks visited nodes, restored below
  let count = 0;
  for (const start of nodes) {
    if (inPart[start] !== stamp) continue;
    let head = 0;
    let tail = 0;
    queue[tail++] = start;
    inPart[start] = seen;
    while (head < tail) {
      const v = queue[head++];
      side[v] = count;
      for (let q = adjStart[v]; q < adjStart[v + 1]; q++) {
        const u = adj[q];
        if (inPart[u] !== stamp) continue;
        inPart[u] = seen;
        queue[tail++] = u;
      }
    }
    count++;
  }
  for (const v of nodes) inPart[v] = stamp;
  return count;
}

/**
 * Minimum degree on the part's subgraph plus its halo: the neighbours outside the part, which all lie in
 * separators ordered later. The halo is joined into a clique (it will be one once the part is eliminated) so
 * that minimum degree sees the part's boundary nodes as costly, as a constrained minimum degree would; the
 * halo is then dropped from the order.
 */
function orderLeaf(nodes: Int32Array, lo: number, order: Int32Array, adjStart: Int32Array, adj: Int32Array, inPart: Int32Array, stamp: number, local: Int32Array) {
  const k = nodes.length;
  for (let p = 0; p < k; p++) local[nodes[p]] = p;
  const haloIndex = new Map<number, number>();
  const lists: number[][] = [];
  const haloLists: number[][] = [];
  for (let p = 0; p < k; p++) {
    const v = nodes[p];
    const list: number[] = [];
    for (let q = adjStart[v]; q < adjStart[v + 1]; q++) {
      const u = adj[q];
      if (inPart[u] === stamp) {
        list.push(local[u]);
        continue;
      }
      let h = haloIndex.get(u);
      if (h === undefined) {
        h = k + haloLists.length;
        haloIndex.set(u, h);
        haloLists.push([]);
      }
      list.push(h);
      haloLists[h - k].push(p);
    }
    lists.push(list);
  }
  lists.push(...haloLists);
  const total = lists.length;
  const start = new Int32Array(total + 1);
  const flat: number[] = [];
  for (let h = 0; h < total; h++) {
    for (const u of lists[h]) flat.push(u);
    if (h >= k) for (let g = k; g < total; g++) if (g !== h) flat.push(g);
    start[h + 1] = flat.length;
  }
  const leafOrder = approximateMinimumDegree(total, start, Int32Array.from(flat));
  let at = lo;
  for (const p of leafOrder) if (p < k) order[at++] = nodes[p];
}

// Cut directions: x, y, z and the two plan diagonals.
const directions: [number, number, number][] = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
  [Math.SQRT1_2, Math.SQRT1_2, 0],
  [Math.SQRT1_2, -Math.SQRT1_2, 0],
];

type Cut = { score: number; direction: number; position: number; separatorSide: number };

/** The best cut of the part: along `direction`, the first `position` nodes of its sorted list on side 0. */
function bestCut(
  sorted: Int32Array[],
  keys: Float64Array[],
  adjStart: Int32Array,
  adj: Int32Array,
  inPart: Int32Array,
  stamp: number,
  local: Int32Array,
  boundary: { left: Int32Array; right: Int32Array },
): Cut | undefined {
  const k = sorted[0].length;
  const low = Math.max(1, Math.floor(0.3 * k));
  const high = Math.min(k - 1, Math.ceil(0.7 * k));
  const { left: leftBoundary, right: rightBoundary } = boundary;
  let best: Cut | undefined;
  // A plane normal to a direction in which the part is thin (the depth of a roof) cuts it lengthwise: skip it.
  const extent = sorted.map((list, direction) => keys[direction][list[k - 1]] - keys[direction][list[0]]);
  const widest = Math.max(...extent);
  for (let direction = 0; direction < sorted.length; direction++) {
    const list = sorted[direction];
    if (extent[direction] < 0.25 * widest) continue;
    const key = keys[direction];
    for (let p = 0; p < k; p++) local[list[p]] = p;
    // Node at p is on the left boundary of cut t (left = positions < t) when p < t <= its furthest neighbour,
    // on the right boundary when its nearest neighbour < t <= p.
    leftBoundary.fill(0, 0, k + 1);
    rightBoundary.fill(0, 0, k + 1);
    for (let p = 0; p < k; p++) {
      const v = list[p];
      let far = p;
      let near = p;
      for (let q = adjStart[v]; q < adjStart[v + 1]; q++) {
        const u = adj[q];
        if (inPart[u] !== stamp) continue;
        far = Math.max(far, local[u]);
        near = Math.min(near, local[u]);
      }
      if (far > p) {
        leftBoundary[p + 1]++;
        leftBoundary[far + 1]--;
      }
      if (near < p) {
        rightBoundary[near + 1]++;
        rightBoundary[p + 1]--;
      }
    }
    let left = 0;
    let right = 0;
    for (let t = 1; t <= high; t++) {
      left += leftBoundary[t];
      right += rightBoundary[t];
      if (t < low || key[list[t - 1]] === key[list[t]]) continue; // cut only between distinct positions
      const separatorSide = left <= right ? 0 : 1;
      const separator = Math.min(left, right);
      const a = t - (separatorSide === 0 ? separator : 0);
      const b = k - t - (separatorSide === 1 ? separator : 0);
      if (a === 0 || b === 0) continue;
      const score = (separator * separator) / (a * b);
      if (!best || score < best.score) best = { score, direction, position: t, separatorSide };
    }
  }
  return best;
}

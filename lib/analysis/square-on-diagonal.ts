// The square-on-diagonal layout of a double-layer grid: a top layer of square bays; bottom nodes under the centres
// of every other bay, in a checkerboard (bay i, j with i + j even); bottom chords joining the bottom nodes of bays
// that touch at a corner, so they run at 45 degrees to the top chords with a module of a times root 2. It saves about
// a quarter of the members of square on square offset. (The layout is the classic one of the double-layer grid
// literature, described here from memory; the generator's tests check that every grid built is stable and in
// equilibrium.)

/** True for a bay that has a bottom node (a "pyramid" bay). */
export function hasBottomNode(i: number, j: number): boolean {
  return (i + j) % 2 === 0;
}

/**
 * The bays with a bottom node, each with the plan area of services it carries: its own bay, plus an equal share of
 * each edge-adjacent bay without a bottom node (so the whole roof's area is carried exactly once).
 */
export function diagonalBays(nx: number, ny: number, a: number): { i: number; j: number; area: number }[] {
  const share = new Map<string, number>();
  const key = (i: number, j: number) => `${i},${j}`;
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) if (hasBottomNode(i, j)) share.set(key(i, j), a * a);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      if (hasBottomNode(i, j)) continue;
      const neighbours = [
        [i - 1, j],
        [i + 1, j],
        [i, j - 1],
        [i, j + 1],
      ].filter(([p, q]) => p >= 0 && p < nx && q >= 0 && q < ny);
      for (const [p, q] of neighbours) share.set(key(p, q), share.get(key(p, q))! + (a * a) / neighbours.length);
    }
  }
  const bays: { i: number; j: number; area: number }[] = [];
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) if (hasBottomNode(i, j)) bays.push({ i, j, area: share.get(key(i, j))! });
  return bays;
}

/** Bottom chords from each bottom node to its north-east and south-east neighbours (bays touching at a corner). */
export function diagonalBottomChords(nx: number, ny: number): { id: string; from: [number, number]; to: [number, number] }[] {
  const chords: { id: string; from: [number, number]; to: [number, number] }[] = [];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      if (!hasBottomNode(i, j) || i + 1 >= nx) continue;
      if (j + 1 < ny) chords.push({ id: `BCD-${i}-${j}-NE`, from: [i, j], to: [i + 1, j + 1] });
      if (j - 1 >= 0) chords.push({ id: `BCD-${i}-${j}-SE`, from: [i, j], to: [i + 1, j - 1] });
    }
  }
  return chords;
}

/** Node and member counts of an nx by ny square-on-diagonal grid, without building it. */
export function squareOnDiagonalSize(nx: number, ny: number): { nodes: number; members: number } {
  const bottomNodes = Math.ceil((nx * ny) / 2);
  // Chords to the north-east: pyramid bays (i, j) with i < nx - 1, j < ny - 1; to the south-east: i < nx - 1, j >= 1.
  const pyramids = (iMax: number, jFrom: number, jTo: number) => {
    let count = 0;
    for (let j = jFrom; j < jTo; j++) count += Math.ceil((iMax - ((j % 2) === 0 ? 0 : 1)) / 2);
    return count;
  };
  const bottomChords = pyramids(nx - 1, 0, ny - 1) + pyramids(nx - 1, 1, ny);
  const topChords = nx * (ny + 1) + ny * (nx + 1);
  return { nodes: (nx + 1) * (ny + 1) + bottomNodes, members: topChords + 4 * bottomNodes + bottomChords };
}

// Tunables of the 3D viewer. Colours are the product's own (see the glossary kept with the design notes).

export const palette = {
  tension: "#0f766e",
  compression: "#c2410c",
  zeroForce: "#94a3b8",
  selection: "#7c3aed",
  /** Measured points and the line between them: near-black, apart from every force colour. */
  measure: "#111827",
  hover: "#a78bfa",
  neutral: "#f1f5f9",
  member: "#475569",
  filteredOut: "#e2e8f0",
  node: "#1e293b",
  support: "#334155",
  load: "#be185d",
  gridMajor: "#cbd5e1",
  gridMinor: "#e2e8f0",
  background: "#f8fafc",
} as const;

/** Colours for the member verdicts of the review engine. Picked to stay apart for common colour-vision types. */
export const verdictColours = {
  "load-bearing": "#334155",
  stabilising: "#d97706",
  bracing: "#2563eb",
  idle: "#db2777",
} as const;

/**
 * ΔN ramp of the comparison (change of axial force from the compared result to the chosen one): deep blue where the
 * force moved towards tension, dark amber where it moved towards compression, the neutral tint where it did not
 * change. Ours, kept apart from the tension and compression colours (a rise in N is not tension); blue against amber
 * stays apart for the common colour-vision types.
 */
export const deltaForceScale = { rise: "#1e40af", fall: "#92400e" } as const;

/** Utilisation ramp: light at 0, deep navy at 1; anything over 1 is drawn in a warning red. */
export const utilisationScale = { low: "#e2e8f0", high: "#1e3a8a", over: "#b91c1c" } as const;

export const memberLook = {
  /** Member radius as a fraction of the model's typical member length. */
  minRadius: 0.012,
  maxRadius: 0.045,
  zeroRadius: 0.006,
  translucentOpacity: 0.35,
  /** How much of the sign colour a low-force member keeps (the rest is white). */
  lowForceTint: 0.35,
  radialSegments: 8,
  /**
   * Above this many members: 3-sided members, lighter glyphs and no antialiasing. A member is then a few pixels wide and
   * a software-rendered frame's cost follows the triangle count (issue 13: the 60 × 60 roof's first frame).
   */
  largeModel: 5000,
  radialSegmentsLarge: 3,
} as const;

export const glyphLook = {
  /** Node sphere radius as a fraction of the typical member length. */
  nodeRadius: 0.03,
  supportSize: 0.12,
  /** Longest load arrow as a multiple of the typical member length. */
  maxLoadArrow: 0.9,
  /** Sides of a load arrow's shaft and head; on a large roof (memberLook.largeModel) 3, open-ended, and nodes as tetrahedra. */
  arrowShaftSides: 4,
  arrowHeadSides: 6,
  arrowSidesLarge: 3,
} as const;

export const influenceLook = {
  /** Sphere radius at each top-layer node, as a fraction of the typical member length (larger than a node glyph). */
  radius: 0.075,
  widthSegments: 12,
  heightSegments: 8,
} as const;

export const cameraLook = {
  fov: 40,
  transitionSeconds: 0.6,
  fitPadding: 0.9,
  /** A member stepped to with the keyboard within this fraction of the canvas's edges counts as off screen. */
  followMargin: 0.05,
} as const;

/**
 * The stage holding the canvas: its bottom meets the window's bottom (less a small gap, so the fold shows where the
 * page goes on), but never shorter than a usable view on a short or phone-sized window.
 */
export const viewerStage = { minHeight: 360, bottomGap: 12 } as const;

// Every bound on what users may send, stated once. zod schemas, the roof generator, the socket server, the Yjs
// endpoint, the request-body caps and the forms read their numbers from here (README, "Limits"). Pure: no I/O.

/** PostgreSQL `integer` columns (revision numbers, segment indexes) hold 1 … 2^31 − 1. */
export const PG_INTEGER_MAX = 2_147_483_647;

/** Identifiers and numbers that name stored rows. */
export const ids = {
  /** Revision numbers: positive and within the `model_revisions.number` integer column. */
  revisionNumber: { min: 1, max: PG_INTEGER_MAX },
  /** Ids inside a model (nodes, members, sections, materials, load cases, combinations) and anchors on them. */
  elementIdChars: 120,
  /** MEP run tags chosen by the designer ("SA-01"). */
  runIdChars: 64,
  /** Invitation tokens in join links. */
  tokenChars: { min: 20, max: 200 },
  /** uuids are 36 characters; anything longer in a handshake or path is refused before it is parsed. */
  uuidChars: 36,
} as const;

/** How large a model may be: the solver stays within memory and a few seconds, and the viewer stays usable. */
export const modelCounts = {
  nodes: 30_000,
  members: 120_000,
  materials: 100,
  sections: 1_000,
  supports: 30_000,
  loadCases: 200,
  combinations: 500,
  /** Nodal loads summed over every load case. */
  nodalLoads: 300_000,
  /** Factors in one combination (one per load case at most). */
  factorsPerCombination: 200,
} as const;

/**
 * Physically plausible ranges (units of the model format: m, kN, kPa, kN/m3). Wider than any real roof so no honest
 * model is refused; narrow enough that squares and products in the solver stay far from overflow.
 */
export const physical = {
  /** |x|, |y|, |z| of nodes and run points, m. */
  coordinate: 10_000,
  /** Shortest distance between two nodes, m: closer nodes are treated as the same point and refused. */
  nodeSpacing: 1e-4,
  /** Longest member, m. */
  memberLength: 1_000,
  /** Young's modulus, kPa (structural timber is about 1e7, steel 2.1e8). */
  youngsModulus: { min: 1e5, max: 1e9 },
  /** Yield strength, kPa (up to 5000 MPa). */
  yieldStrength: { min: 1, max: 5e6 },
  /** Unit weight, kN/m3 (steel 78.5). */
  unitWeight: { min: 0, max: 1_000 },
  /** Cross-section area, m2. */
  area: { min: 1e-8, max: 1 },
  /** Radius of gyration, outer diameter and wall thickness, m. */
  sectionLength: { min: 0, max: 10 },
  /** Buckling length factor K. */
  effectiveLengthFactor: { min: 0.01, max: 10 },
  /** |Fx|, |Fy|, |Fz| of one nodal load, kN. */
  nodalLoad: 1e6,
  /** |factor| of a load case in a combination. */
  combinationFactor: 100,
  /** Pressures of the roof generator, kN/m2. */
  pressure: 100,
} as const;

/** The roof generator, checked by what it would produce before anything is built. */
export const generator = {
  /** Each span, m. */
  span: { min: 0.5, max: 300 },
  /** Module (bay size), m. */
  module: { min: 0.5, max: 50 },
  /** Depth between the layers, m. */
  depth: { min: 0.1, max: 50 },
  /** The grid may produce at most this many nodes and members (modelCounts applies to generated roofs too). */
  nodes: modelCounts.nodes,
  members: modelCounts.members,
} as const;

/** MEP runs of one revision. */
export const runCounts = {
  runs: 2_000,
  pointsPerRun: 1_000,
  /** Points summed over every run of an import. */
  points: 100_000,
} as const;

/** Text lengths, in characters. */
export const text = {
  name: 200,
  projectName: 120,
  description: 2_000,
  personName: 120,
  email: 254,
  password: 200,
  pinTitle: 200,
  comment: 10_000,
  note: 2_000,
  conditions: 4_000,
  fileName: 200,
  contentType: 100,
  system: 80,
  /** Result ids (load case or combination ids) in queries. */
  resultId: 120,
  /** Longest query string value in general. */
  queryValue: 2_000,
} as const;

/** How many problems one answer lists; the rest are counted ("and 1,234 more"). */
export const reportedProblems = 200;

/** Request bodies by kind of route, in bytes (checked before the body is read). */
export const requestBytes = {
  /** Ordinary JSON forms and commands. */
  json: 64 * 1024,
  /** Server actions (form fields). */
  action: 256 * 1024,
  /** MEP run imports (CSV or JSON text inside JSON). */
  runsImport: 4 * 1024 * 1024,
  /** Model uploads (JSON model or CSV tables inside JSON): the largest model counts above fit well within. */
  modelUpload: 48 * 1024 * 1024,
} as const;

/**
 * Largest model file uploaded through the presigned path (the upload form), bytes: refused from its declared size
 * before any byte moves, and again from the stored size. A 120 × 120 bay grid in our JSON format is about 6 MB.
 */
export const modelFileBytes = 20 * 1024 * 1024;

/** Files in one model upload (one JSON model, or the CSV tables). */
export const modelUploadFiles = 12;

/** Largest model upload file in characters (one JSON model or one CSV table). */
export const modelUploadChars = 40_000_000;

/** Largest MEP run file in characters. */
export const runsFileChars = 2_000_000;

/** Attachments uploaded to object storage, bytes. */
export const attachmentBytes = 50 * 1024 * 1024;

/** Request headers, bytes (Node answers 431 beyond this). */
export const headerBytes = 16 * 1024;

/** The realtime process. */
export const realtime = {
  /** One socket.io message, bytes (socket.io drops larger ones; we answer with an error first where we can). */
  socketPayloadBytes: 128 * 1024,
  /** One Yjs message (update) from a client, bytes. */
  yjsUpdateBytes: 256 * 1024,
  /** A project's whole Yjs document (shared session notes), bytes. */
  yjsDocumentBytes: 2 * 1024 * 1024,
} as const;

/**
 * The whole-roof checks stored with every review (overall stability by linear buckling, idle for any roof load) grow
 * faster than the analysis: about 8 s for 7,200 members on this 2-core machine, minutes for 28,800. Above this many
 * members they are left out of the stored review, which says so, so a large roof is still analysed and reviewed.
 */
export const wholeRoofCheckMembers = 10_000;

/**
 * The heap of the jobs process's analysis thread (server/jobs/analysis-thread.ts), MB: a 120 x 120 roof (115,200
 * members, 8 results) uses about 0.6 GB. A model past this fails its job with the reason instead of taking the
 * machine's memory from everyone else.
 */
export const analysisThreadHeapMb = 2048;

/** Database sessions of the app: no statement runs, and no transaction sits idle, longer than this. */
export const database = {
  statementTimeoutMs: 30_000,
  idleInTransactionTimeoutMs: 10_000,
} as const;

/** A human-readable byte size for messages ("64 kB", "48 MB"). */
export function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${+(bytes / (1024 * 1024)).toFixed(1)} MB`;
  if (bytes >= 1024) return `${+(bytes / 1024).toFixed(1)} kB`;
  return `${bytes} bytes`;
}

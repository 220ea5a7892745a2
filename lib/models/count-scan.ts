// The model's size caps checked on the raw text before it is parsed (issue 13 item 2): one pass over the characters
// counts the entries of each top-level array (nodes, members, load cases …) and stops at the first count over its
// cap in lib/limits.ts, with nothing parsed into objects and nothing stored. Our own small scanner: jsonc-parser's
// visitor (the well-known token walker) measured 7 × slower than JSON.parse itself on a 30,000-node model, which
// would make every honest upload pay for the check; this loop only tracks strings, escapes and depth.
import { PayloadTooLargeError } from "@/lib/http/errors";
import { modelCounts } from "@/lib/limits";

/** The top-level arrays of our model format that have a cap, with the words for the answer. */
const CAPPED = {
  nodes: { cap: modelCounts.nodes, words: "nodes" },
  members: { cap: modelCounts.members, words: "members" },
  supports: { cap: modelCounts.supports, words: "supports" },
  materials: { cap: modelCounts.materials, words: "materials" },
  sections: { cap: modelCounts.sections, words: "sections" },
  loadCases: { cap: modelCounts.loadCases, words: "load cases" },
  combinations: { cap: modelCounts.combinations, words: "load combinations" },
} as const;
type Capped = keyof typeof CAPPED;
const isCapped = (key: string | null): key is Capped => key !== null && Object.hasOwn(CAPPED, key);

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const OPEN_BRACE = 0x7b;
const OPEN_BRACKET = 0x5b;
const CLOSE_BRACE = 0x7d;
const CLOSE_BRACKET = 0x5d;

/**
 * Refuses (413, naming the limit) a JSON model whose nodes, members, supports, materials, sections, load cases or
 * combinations exceed lib/limits.ts modelCounts, counted on the text before parsing. Text that is not JSON is left
 * to the parser, which names the line and column; the validator still checks every count after parsing.
 */
export function refuseOversizedModelText(text: string, fileName: string): void {
  const counts: Record<Capped, number> = { nodes: 0, members: 0, supports: 0, materials: 0, sections: 0, loadCases: 0, combinations: 0 };
  let depth = 0;
  // The last string closed at depth 1: before a '[' at depth 1 it is always that array's key.
  let lastKey: string | null = null;
  let inArray: Capped | null = null;
  for (let at = 0; at < text.length; at += 1) {
    const c = text.charCodeAt(at);
    if (c === QUOTE) {
      const start = at + 1;
      for (at = start; at < text.length; at += 1) {
        const s = text.charCodeAt(at);
        if (s === BACKSLASH) at += 1;
        else if (s === QUOTE) break;
      }
      if (depth === 1) lastKey = text.slice(start, at);
    } else if (c === OPEN_BRACE || c === OPEN_BRACKET) {
      if (depth === 1 && c === OPEN_BRACKET) inArray = isCapped(lastKey) ? lastKey : null;
      depth += 1;
      if (depth === 3 && inArray && ++counts[inArray] > CAPPED[inArray].cap) {
        const { cap, words } = CAPPED[inArray];
        throw new PayloadTooLargeError(`${fileName} has more than ${cap.toLocaleString("en")} ${words}, the most one model may have (README, "Model size limits"). Split the roof or simplify it.`);
      }
    } else if (c === CLOSE_BRACE || c === CLOSE_BRACKET) {
      depth -= 1;
      if (depth === 1) inArray = null;
    }
  }
}

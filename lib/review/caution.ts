/** The standing caution shown with every verdict (glossary.md), verbatim. */
export const STANDING_CAUTION =
  "Advisory results for coordination. Any removal, opening or change to a structural member needs the written approval of the engineer of record under the applicable local codes.";

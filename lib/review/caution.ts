/** The standing caution shown with every verdict (glossary.md), verbatim. */
export const STANDING_CAUTION =
  "Advisory results for coordination. Any removal, opening or change to a structural member needs the written approval of the engineer of record under the applicable local codes.";

/**
 * What no check of Strutroom covers, said beside the caution wherever whole-roof results are shown (issue 15: the
 * caution says that connections and nodes are not checked).
 */
export const NOT_CHECKED =
  "Not checked: connections and nodes (joints): their strength, stiffness and eccentricity; local buckling, shear lag at the connections, fatigue, second-order analysis and anything not axial.";

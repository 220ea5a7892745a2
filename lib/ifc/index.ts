import { isProblem, openIfc, type IfcProblem } from "./reader";
import { readRoof, type IfcRoofResult } from "./roof";
import { readRuns, type IfcRunsResult } from "./runs";

export { JOIN_TOLERANCE, runIdFromGlobalId, type IfcRunsResult } from "./runs";
export { MAX_IFC_BYTES, type IfcProblem } from "./reader";
export { NODE_TOLERANCE, type IfcRoofResult } from "./roof";
export { exportIfc, type ExportOpening, type ExportResult, type IfcExportInput } from "./export";
export { memberGlobalId } from "./guid";

/** Reads the duct, pipe and cable-tray runs of IFC bytes, or one file-level problem. */
export async function readIfcRuns(bytes: Uint8Array): Promise<IfcRunsResult | IfcProblem> {
  const reader = await openIfc(bytes);
  if (isProblem(reader)) return reader;
  try {
    return readRuns(reader);
  } finally {
    reader.close();
  }
}

/** Reads the roof of IFC bytes into our model format (every problem listed), or one file-level problem. */
export async function readIfcRoof(bytes: Uint8Array): Promise<IfcRoofResult | IfcProblem> {
  const reader = await openIfc(bytes);
  if (isProblem(reader)) return reader;
  try {
    return readRoof(reader);
  } finally {
    reader.close();
  }
}

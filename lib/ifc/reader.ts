import * as WebIFC from "web-ifc";

/** A problem found while reading an IFC file: the element's GlobalId (or "#id", or "file") and why. */
export interface IfcProblem {
  where: string;
  message: string;
}

/** An IFC entity as web-ifc returns it without flattening: attributes are values, references or lists. */
export type IfcLine = Record<string, unknown> & { expressID: number; type: number };

/** Largest IFC file we read (bytes): web-ifc holds the whole file in wasm memory. */
export const MAX_IFC_BYTES = 200 * 1024 * 1024;

let api: Promise<WebIFC.IfcAPI> | undefined;

// One wasm instance per process; web-ifc locates its own .wasm beside its Node entry point.
function ifcApi(): Promise<WebIFC.IfcAPI> {
  api ??= (async () => {
    const instance = new WebIFC.IfcAPI();
    await instance.Init();
    return instance;
  })();
  return api;
}

/** Read access to one open IFC model; always `close()` it (the model lives in wasm memory). */
export interface IfcReader {
  schema: string;
  idsOf(type: number): number[];
  line(id: number): IfcLine | undefined;
  typeName(line: IfcLine): string;
  close(): void;
}

/** Opens IFC STEP bytes; refuses files that are too big or not IFC STEP at all. */
export async function openIfc(bytes: Uint8Array): Promise<IfcReader | IfcProblem> {
  if (bytes.byteLength > MAX_IFC_BYTES) return { where: "file", message: `The file is larger than ${MAX_IFC_BYTES / 1024 / 1024} MB.` };
  const head = new TextDecoder().decode(bytes.subarray(0, 2048));
  if (!head.startsWith("ISO-10303-21;")) return { where: "file", message: "Not an IFC file in STEP form (it must start with ISO-10303-21;)." };
  const schemaMatch = /FILE_SCHEMA\s*\(\s*\(\s*'([^']+)'/i.exec(head);
  const declared = schemaMatch?.[1].toUpperCase() ?? "";
  if (declared !== "IFC2X3" && declared !== "IFC4") return { where: "file", message: `Schema "${declared || "none"}" is not read; give IFC2X3 or IFC4.` };
  const ifc = await ifcApi();
  const modelId = ifc.OpenModel(bytes);
  if (modelId < 0) return { where: "file", message: "web-ifc could not open the file." };
  return {
    schema: ifc.GetModelSchema(modelId),
    idsOf(type) {
      const vector = ifc.GetLineIDsWithType(modelId, type, true);
      const ids: number[] = [];
      for (let k = 0; k < vector.size(); k++) ids.push(vector.get(k));
      return ids;
    },
    line(id) {
      try {
        return ifc.GetLine(modelId, id, false) as IfcLine;
      } catch {
        return undefined;
      }
    },
    typeName: (line) => ifc.GetNameFromTypeCode(line.type),
    close: () => ifc.CloseModel(modelId),
  };
}

export const isProblem = (value: IfcReader | IfcProblem): value is IfcProblem => "message" in value;

/** A reference attribute's target id, or undefined. */
export function refId(value: unknown): number | undefined {
  if (value && typeof value === "object" && (value as { type?: unknown }).type === 5) return (value as { value: number }).value;
  return undefined;
}

/** A list attribute's references. */
export function refIds(value: unknown): number[] {
  return Array.isArray(value) ? value.map(refId).filter((id): id is number => id !== undefined) : [];
}

/** A simple attribute's value (label, measure, enum, boolean) as string, number or boolean. */
export function plain(value: unknown): string | number | boolean | undefined {
  if (value === null || value === undefined) return undefined;
  if (typeof value !== "object") return value as string | number | boolean;
  const v = value as { value?: unknown; _representationValue?: unknown };
  if (v._representationValue !== undefined) return v._representationValue as number;
  if (v.value !== undefined && typeof v.value !== "object") return v.value as string | number | boolean;
  return undefined;
}

export const num = (value: unknown): number | undefined => {
  const v = plain(value);
  if (typeof v === "number") return v;
  if (typeof v === "string" && v.trim() !== "" && Number.isFinite(Number(v))) return Number(v);
  return undefined;
};

export const text = (value: unknown): string | undefined => {
  const v = plain(value);
  return typeof v === "string" && v !== "" ? v : undefined;
};

export const nums = (value: unknown): number[] => (Array.isArray(value) ? value.map((v) => num(v) ?? Number.NaN) : []);

/** The line's GlobalId, or "#expressID" for entities without one. */
export const whereOf = (line: IfcLine): string => text(line.GlobalId) ?? `#${line.expressID}`;

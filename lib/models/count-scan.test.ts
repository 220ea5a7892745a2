// The size caps on the raw text (issue 13 item 2), against lib/limits.ts modelCounts (our own stated limits).
import { describe, expect, it } from "vitest";
import { HttpError } from "@/lib/http/errors";
import { modelCounts } from "@/lib/limits";
import { refuseOversizedModelText } from "./count-scan";

/** A model text with `nodes` nodes (only the parts the scan reads need to be present). */
function modelText(nodes: number, extra = ""): string {
  const list = Array.from({ length: nodes }, (_, k) => `{"id":"N${k}","x":${k},"y":0,"z":0}`).join(",");
  return `{"format":"truss-model/1","name":"scan","nodes":[${list}],"members":[]${extra}}`;
}

function refusal(text: string): HttpError | null {
  try {
    refuseOversizedModelText(text, "roof.json");
    return null;
  } catch (error) {
    if (error instanceof HttpError) return error;
    throw error;
  }
}

describe("model size caps on the raw text", () => {
  it("accepts a model at the node cap and refuses one more with a 413 naming the limit", () => {
    expect(refusal(modelText(modelCounts.nodes))).toBeNull();
    const over = refusal(modelText(modelCounts.nodes + 1));
    expect(over?.status).toBe(413);
    expect(over?.message).toContain("roof.json has more than 30,000 nodes");
  });

  it("refuses a 1e6-node file (about 30 MB)", () => {
    const nodes = `${'{"id":"N","x":0,"y":0,"z":0},'.repeat(999_999)}{"id":"N","x":0,"y":0,"z":0}`;
    const over = refusal(`{"format":"truss-model/1","name":"huge","nodes":[${nodes}]}`);
    expect(over?.status).toBe(413);
    expect(over?.message).toMatch(/30,000 nodes/);
  });

  it("is not fooled by brackets, braces and escaped quotes inside strings", () => {
    // Each id holds characters that would shift the depth if strings were not skipped whole.
    const tricky = (n: number) => `{"name":"nodes ] [","nodes":[${Array(n).fill('{"id":"}]\\\\\\"{["}').join(",")}],"members":[]}`;
    expect(JSON.parse(tricky(2)).nodes[0].id).toBe('}]\\"{[');
    expect(refusal(tricky(modelCounts.nodes))).toBeNull();
    expect(refusal(tricky(modelCounts.nodes + 1))?.status).toBe(413);
  });

  it("counts only the entries of the top-level arrays, not arrays nested inside them", () => {
    const loads = Array.from({ length: modelCounts.loadCases + 5 }, (_, k) => `{"node":"N${k}","fx":0,"fy":0,"fz":-1}`).join(",");
    const oneCase = `,"loadCases":[{"id":"G","name":"dead","nodalLoads":[${loads}]}]`;
    expect(refusal(modelText(3, oneCase))).toBeNull();
    const manyCases = `,"loadCases":[${Array.from({ length: modelCounts.loadCases + 1 }, (_, k) => `{"id":"C${k}","nodalLoads":[]}`).join(",")}]`;
    expect(refusal(modelText(3, manyCases))?.message).toContain(`more than ${modelCounts.loadCases} load cases`);
  });

  it("leaves text that is not JSON to the parser, which names where it breaks", () => {
    expect(refusal('{"nodes": [')).toBeNull();
    expect(refusal("not json")).toBeNull();
  });
});

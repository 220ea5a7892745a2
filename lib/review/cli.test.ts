import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { STANDING_CAUTION } from "./caution";
import { prattTruss } from "./test-models";

const dir = mkdtempSync(join(tmpdir(), "strutroom-review-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function analyze(...args: string[]) {
  const out = spawnSync(join(process.cwd(), "node_modules/.bin/tsx"), ["scripts/analyze.ts", ...args], { encoding: "utf8", timeout: 60_000 });
  return { code: out.status, stdout: out.stdout, stderr: out.stderr };
}

describe("npm run analyze -- --review", { timeout: 60_000 }, () => {
  const file = join(dir, "pratt.json");
  writeFileSync(file, JSON.stringify(prattTruss()));

  it("adds the review under a top-level review key, standard as asked", () => {
    const out = analyze(file, "--review", "--standard", "AISC360-22");
    expect(out.code).toBe(0);
    const parsed = JSON.parse(out.stdout);
    expect(parsed.status).toBe("ok");
    expect(parsed.review.standard).toBe("AISC360-22");
    expect(parsed.review.caution).toBe(STANDING_CAUTION);
    const u2l2 = parsed.review.members.find((m: { member: string }) => m.member === "U2L2");
    expect(u2l2.verdict.verdict).toBe("stabilising"); // check-values §5.3 Ex. 4 removal checks
  });

  it("leaves the output unchanged without --review and refuses an unknown standard", () => {
    expect(JSON.parse(analyze(file).stdout).review).toBeUndefined();
    const bad = analyze(file, "--review", "--standard", "BS5950");
    expect(bad.code).toBe(1);
    expect(bad.stderr).toMatch(/--standard must be one of/);
  });
});

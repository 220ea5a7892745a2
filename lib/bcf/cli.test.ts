import { spawnSync } from "node:child_process";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

// Runs the real command line (scripts/bcf.ts through tsx) on an official BCF 3.0 test archive.
function run(...args: string[]) {
  const out = spawnSync(join(process.cwd(), "node_modules/.bin/tsx"), ["scripts/bcf.ts", ...args], { encoding: "utf8", timeout: 60_000 });
  return { code: out.status, stdout: out.stdout, stderr: out.stderr };
}

describe("npm run -s bcf (scripts/bcf.ts)", () => {
  it("inspect: exit 0 with version and topics; 2 for a file that is not BCF; 1 for usage", () => {
    const ok = run("inspect", "tests/fixtures/bcf/test-cases/component selection.bcf");
    expect(ok.code).toBe(0);
    expect(JSON.parse(ok.stdout)).toEqual({
      version: "3.0",
      topics: [{ guid: "647bca1c-cac3-4f16-84a8-912e081edd57", title: "Component Selection", status: "OPEN", type: "WARNING", comments: 0, viewpoints: 1 }],
    });
    const bad = run("inspect", "package.json");
    expect(bad.code).toBe(2);
    expect(bad.stderr).toContain("archive: not a readable BCF zip archive");
    expect(run("list", "x.bcf").code).toBe(1);
  }, 90_000);
});

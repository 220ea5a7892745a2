import { describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { ConflictError, ForbiddenError, NotFoundError, UnauthorizedError, ValidationError, errorBody, handleRoute, issuesFrom } from "./errors";

describe("error module", () => {
  it("maps each error kind to its status and keeps the user-facing message", () => {
    expect(errorBody(new UnauthorizedError()).status).toBe(401);
    expect(errorBody(new ForbiddenError()).status).toBe(403);
    expect(errorBody(new NotFoundError()).status).toBe(404);
    expect(errorBody(new ConflictError("Taken.", [{ path: "email", message: "Taken." }]))).toEqual({
      status: 409,
      body: { error: "Taken.", issues: [{ path: "email", message: "Taken." }] },
    });
  });

  it("turns zod issues into { path, message } with dotted paths", () => {
    const result = z.object({ a: z.object({ b: z.string() }) }).safeParse({ a: { b: 1 } });
    expect(result.success).toBe(false);
    if (!result.success) expect(issuesFrom(result.error)).toEqual([{ path: "a.b", message: expect.any(String) }]);
  });

  it("never echoes an unexpected error, and answers a wrapped unique violation with 409", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const secret = new Error("connection string postgres://user:pw@host");
    const response = await handleRoute(async () => {
      throw secret;
    })(new Request("http://x/"), undefined);
    expect(response.status).toBe(500);
    expect(JSON.stringify(await response.json())).not.toContain("postgres://");
    const wrapped = Object.assign(new Error("Failed query"), { cause: Object.assign(new Error("duplicate key"), { code: "23505" }) });
    expect(errorBody(wrapped).status).toBe(409);
    expect(errorBody(new ValidationError([{ path: "x", message: "bad" }])).status).toBe(400);
    log.mockRestore();
  });

  it("lists the first 200 problems of a huge bad file and counts the rest in one more line", () => {
    const issues = Array.from({ length: 3_900 }, (_, k) => ({ path: `row ${k}`, message: "bad" }));
    const error = new ValidationError(issues);
    expect(error.issues).toHaveLength(201);
    expect(error.issues?.[200].message).toBe("…and 3,700 more problems not listed.");
    expect(new ValidationError(issues.slice(0, 200)).issues).toHaveLength(200);
  });
});

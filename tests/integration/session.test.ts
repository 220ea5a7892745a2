import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser, verifySessionCookie } from "@/lib/auth/session-cookie";
import { ForbiddenError, NotFoundError, UnauthorizedError } from "@/lib/http/errors";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, sessionCookie } from "../support/session";

let fx: ProjectFixture;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("session");
});
afterAll(closeDb);

describe("session helpers", () => {
  it("reads the user from a route handler request and from a raw Cookie header", async () => {
    const person = fx.users.mep_engineer;
    const expected = { id: person.id, email: person.email, name: person.name };
    expect(await getRequestUser(await buildRequest("/x", { user: person }))).toEqual(expected);
    expect(await verifySessionCookie(`theme=dark; ${await sessionCookie(person)}; other=1`)).toEqual(expected);
  });

  it("rejects missing, forged and foreign-secret cookies", async () => {
    expect(await verifySessionCookie(undefined)).toBeNull();
    expect(await verifySessionCookie("next-auth.session-token=forged")).toBeNull();
    const real = await sessionCookie(fx.users.viewer);
    const secret = process.env.NEXTAUTH_SECRET;
    process.env.NEXTAUTH_SECRET = "a-different-secret-entirely";
    try {
      expect(await verifySessionCookie(real)).toBeNull();
    } finally {
      process.env.NEXTAUTH_SECRET = secret;
    }
  });
});

describe("requireProjectRole", () => {
  it("throws 401, 404 and 403 in that order, and returns the membership when allowed", async () => {
    await expect(requireProjectRole(null, fx.projectId, "project.read")).rejects.toBeInstanceOf(UnauthorizedError);
    await expect(requireProjectRole(fx.users.outsider, fx.projectId, "project.read")).rejects.toBeInstanceOf(NotFoundError);
    await expect(requireProjectRole(fx.users.viewer, fx.projectId, "pin.create")).rejects.toBeInstanceOf(ForbiddenError);
    const membership = await requireProjectRole(fx.users.structural_engineer, fx.projectId, "model.edit");
    expect(membership).toMatchObject({ projectId: fx.projectId, userId: fx.users.structural_engineer.id, role: "structural_engineer" });
  });
});

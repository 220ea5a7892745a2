import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listProjects } from "@/app/api/projects/route";
import { GET as getProject } from "@/app/api/projects/[projectId]/route";
import { ROLES } from "@/lib/permissions";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("projects-api");
});
afterAll(closeDb);

describe("GET /api/projects", () => {
  it("answers 401 without a session", async () => {
    const response = await listProjects(await buildRequest("/api/projects"), undefined);
    expect(response.status).toBe(401);
    expect(await response.json()).toEqual({ error: expect.any(String) });
  });

  it("answers 401 for a forged session cookie", async () => {
    const request = new Request("http://127.0.0.1/api/projects", { headers: { cookie: "next-auth.session-token=not-a-token" } });
    expect((await listProjects(request, undefined)).status).toBe(401);
  });

  it("lists only the caller's projects, with role and abilities", async () => {
    const response = await listProjects(await buildRequest("/api/projects", { user: fx.users.architect }), undefined);
    expect(response.status).toBe(200);
    const { projects } = await response.json();
    expect(projects).toHaveLength(1);
    expect(projects[0]).toMatchObject({ id: fx.projectId, role: "architect", abilities: { "pin.create": true, "model.edit": false } });
  });

  it("lists nothing for an outsider", async () => {
    const response = await listProjects(await buildRequest("/api/projects", { user: fx.users.outsider }), undefined);
    expect(await response.json()).toEqual({ projects: [] });
  });
});

describe("GET /api/projects/[projectId]", () => {
  const path = () => `/api/projects/${fx.projectId}`;

  it("answers 401 without a session", async () => {
    expect((await getProject(await buildRequest(path()), routeContext({ projectId: fx.projectId }))).status).toBe(401);
  });

  it("answers 404 to a non-member, and to a malformed or unknown id", async () => {
    expect((await getProject(await buildRequest(path(), { user: fx.users.outsider }), routeContext({ projectId: fx.projectId }))).status).toBe(404);
    expect((await getProject(await buildRequest("/api/projects/x", { user: fx.users.owner }), routeContext({ projectId: "not-a-uuid" }))).status).toBe(404);
    const unknown = "00000000-0000-4000-8000-000000000000";
    expect((await getProject(await buildRequest(path(), { user: fx.users.owner }), routeContext({ projectId: unknown }))).status).toBe(404);
  });

  it.each(ROLES)("shows the project to its %s with the server's abilities", async (role) => {
    const response = await getProject(await buildRequest(path(), { user: fx.users[role] }), routeContext({ projectId: fx.projectId }));
    expect(response.status).toBe(200);
    const { project } = await response.json();
    expect(project).toMatchObject({ id: fx.projectId, role });
    expect(project.abilities["team.manage"]).toBe(role === "owner");
    expect(project.abilities["model.edit"]).toBe(role === "structural_engineer");
  });
});

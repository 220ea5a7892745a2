// The web process's JSON refusals (server/web/answers.ts) on a real Node HTTP server, with handlers that answer the
// way Next.js 16 does (next/dist/server/route-modules/app-route/helpers/auto-implement-methods.js: a 405 is
// `new Response(null, { status: 405 })`; the not-found page is streamed HTML; server-action refusals are plain text)
// and the way our route handlers do (JSON, left untouched). The 431 comes from Node's own parser (maxHeaderSize).
import { createServer, request as httpRequest, type RequestListener, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { afterEach, describe, expect, it } from "vitest";
import { headerBytes } from "../../lib/limits";
import { answerClientError, answerRefusalsInJson } from "./answers";

let server: Server | undefined;
afterEach(() => new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve())));

async function serve(handler: RequestListener): Promise<string> {
  server = createServer({ maxHeaderSize: headerBytes }, (request, response) => {
    answerRefusalsInJson(request, response);
    handler(request, response);
  });
  server.on("clientError", answerClientError);
  await new Promise<void>((resolve) => server!.listen(0, "127.0.0.1", resolve));
  return `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
}

type Answer = { status: number; type: string | null; body: string };
async function answer(url: string, init?: RequestInit): Promise<Answer> {
  const response = await fetch(url, init);
  return { status: response.status, type: response.headers.get("content-type"), body: await response.text() };
}

function errorOf(answer: Answer): string {
  expect(answer.type).toBe("application/json");
  const body = JSON.parse(answer.body) as { error?: unknown };
  expect(typeof body.error).toBe("string");
  return body.error as string;
}

const nextLike405: RequestListener = (_request, response) => {
  response.statusCode = 405;
  response.end();
};

describe("refusals of API addresses and server actions are JSON with what to do", () => {
  it("an empty 405 names the method and how to find the allowed ones", async () => {
    const base = await serve(nextLike405);
    const reply = await answer(`${base}/api/projects`, { method: "PATCH" });
    expect(reply.status).toBe(405);
    expect(errorOf(reply)).toMatch(/does not take PATCH requests.*OPTIONS/);
  });

  it("an HTML 404 written in chunks becomes a JSON 404 naming the address, with no HTML left", async () => {
    const base = await serve((_request, response) => {
      response.statusCode = 404;
      response.setHeader("content-type", "text/html; charset=utf-8");
      response.write("<!DOCTYPE html><html>");
      response.write("<body>not found</body>");
      response.end("</html>");
    });
    const reply = await answer(`${base}/api/nowhere?x=1`);
    expect(reply.status).toBe(404);
    expect(errorOf(reply)).toBe("There is no API address /api/nowhere: check the address (the README lists the API's routes).");
    expect(reply.body).not.toContain("html");
  });

  it("a refusal set through writeHead with its own headers is replaced too", async () => {
    const base = await serve((_request, response) => {
      response.writeHead(413, { "Content-Type": "text/plain", "Content-Length": "9" }).end("too large");
    });
    const reply = await answer(`${base}/api/projects`, { method: "POST", body: "x" });
    expect(reply.status).toBe(413);
    expect(errorOf(reply)).toMatch(/larger than this address takes/);
  });

  it("a server-action refusal in plain text on a page becomes JSON telling to reload", async () => {
    const base = await serve((_request, response) => {
      response.statusCode = 400;
      response.setHeader("content-type", "text/plain");
      response.end("Invalid Server Action request.");
    });
    const reply = await answer(`${base}/projects`, { method: "POST", headers: { "next-action": "not-an-action" }, body: "{ not json" });
    expect(reply.status).toBe(400);
    expect(errorOf(reply)).toMatch(/reload the page/);
  });

  it("a route handler's own JSON refusal and successful answers pass through untouched", async () => {
    const base = await serve((request, response) => {
      if (request.url === "/api/ok") return void response.writeHead(200, { "content-type": "text/csv" }).end("a,b\n");
      response.writeHead(400, { "content-type": "application/json" }).end(JSON.stringify({ error: "Some fields need attention.", issues: [] }));
    });
    expect(await answer(`${base}/api/ok`)).toEqual({ status: 200, type: "text/csv", body: "a,b\n" });
    expect(JSON.parse((await answer(`${base}/api/bad`)).body)).toEqual({ error: "Some fields need attention.", issues: [] });
  });

  it("pages keep Next's own not-found page", async () => {
    const base = await serve((_request, response) => {
      response.statusCode = 404;
      response.setHeader("content-type", "text/html");
      response.end("<html>not found</html>");
    });
    expect(await answer(`${base}/projects/nowhere`)).toEqual({ status: 404, type: "text/html", body: "<html>not found</html>" });
  });

  it("a huge hostile path is echoed only in part", async () => {
    const base = await serve(nextLike405);
    const reply = await answer(`${base}/api/${"x".repeat(10_000)}`, { method: "DELETE" });
    expect(errorOf(reply).length).toBeLessThan(300);
  });
});

/** A raw HTTP/1.1 request (fetch cannot send headers Node's parser refuses), answered as text. */
function rawRequest(base: string, headers: Record<string, string>): Promise<{ status: number; headers: Record<string, string | string[] | undefined>; body: string }> {
  return new Promise((resolve, reject) => {
    const request = httpRequest(`${base}/api/projects`, { headers }, (response) => {
      let body = "";
      response.on("data", (chunk: Buffer) => (body += chunk.toString()));
      response.on("end", () => resolve({ status: response.statusCode ?? 0, headers: response.headers, body }));
    });
    request.on("error", reject);
    request.end();
  });
}

describe("requests Node's parser refuses", () => {
  it(`headers over ${headerBytes} bytes get 431 with the limit and what to do, as JSON`, async () => {
    let reached = false;
    const base = await serve((_request, response) => {
      reached = true;
      response.end();
    });
    const reply = await rawRequest(base, { cookie: `session=${"c".repeat(headerBytes + 1)}` });
    expect(reply.status).toBe(431);
    expect(reply.headers["content-type"]).toBe("application/json");
    expect(JSON.parse(reply.body)).toEqual({ error: "The request headers are larger than 16 kB: remove some cookies for this site (or sign out and in again) and retry." });
    expect(reached).toBe(false);
  });

  it("headers within the limit reach the handler", async () => {
    const base = await serve((_request, response) => void response.writeHead(204).end());
    expect((await rawRequest(base, { cookie: `session=${"c".repeat(headerBytes / 2)}` })).status).toBe(204);
  });
});

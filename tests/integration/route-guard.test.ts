/**
 * The one route wrapper (lib/api/route.ts) guards every handler before it runs: Origin /
 * Sec-Fetch-Site (the OWASP "Cross-Site Request Forgery Prevention Cheat Sheet": verify
 * the origin with standard headers; Fetch Metadata request headers), content type, body
 * size while streaming, path parameters, and a 5xx that never shows the error's text.
 * The handler here only records that it ran: the guard is what is tested.
 */
import { describe, expect, it } from "vitest";
import "../support/integration";
import { route, readForm, readJson } from "@/lib/api/route";
import { serverEnv } from "@/lib/server/env";

const APP = new URL(serverEnv().APP_URL).origin;
type Ctx = { params: Promise<Record<string, string>> };
const ctx = (params: Record<string, string> = { lab: "kestrel-bay" }): Ctx => ({ params: Promise.resolve(params) });

function handler() {
  const seen: unknown[] = [];
  const fn = route(async (req) => {
    const body = await readJson(req);
    seen.push(body);
    return { ok: true };
  });
  return { fn, seen };
}

const post = (headers: Record<string, string>, body: BodyInit | null = JSON.stringify({ name: "x" })) =>
  new Request(`${APP}/api/labs/kestrel-bay/locations`, { method: "POST", headers: { "content-type": "application/json", ...headers }, body });

async function errorOf(res: Response) {
  return ((await res.json()) as { error: { code: string; message: string; issues: Array<{ path: string }>; errorId?: string } }).error;
}

describe("Origin and Sec-Fetch-Site", () => {
  it("refuses a state-changing request from another site (403 naming the Origin header) and never runs the handler", async () => {
    const { fn, seen } = handler();
    const refused: Array<Record<string, string>> = [{ origin: "https://evil.example" }, { origin: "https://evil.example", "sec-fetch-site": "cross-site" }, { "sec-fetch-site": "cross-site" }, { origin: "null" }];
    for (const headers of refused) {
      const res = await fn(post(headers), ctx());
      expect(res.status, JSON.stringify(headers)).toBe(403);
      expect((await errorOf(res)).issues.map((i) => i.path)).toEqual(["headers.origin"]);
    }
    expect(seen).toEqual([]);
  });

  it("lets through the app's own pages, scripts without either header, and lab API tokens", async () => {
    const { fn, seen } = handler();
    const allowed: Array<Record<string, string>> = [{ origin: APP }, { "sec-fetch-site": "same-origin", origin: APP }, { "sec-fetch-site": "same-origin" }, {}, { authorization: "Bearer tl_example", origin: "https://pipeline.example" }];
    for (const headers of allowed) expect((await fn(post(headers), ctx())).status, JSON.stringify(headers)).toBe(200);
    expect(seen).toHaveLength(allowed.length);
  });

  it("reads (GET) are not checked", async () => {
    const fn = route(async () => ({ ok: true }));
    const res = await fn(new Request(`${APP}/api/labs/kestrel-bay/locations`, { headers: { origin: "https://evil.example" } }), ctx());
    expect(res.status).toBe(200);
  });
});

describe("content type and size", () => {
  it("refuses text/plain and form bodies on a JSON route (415), as a cross-site form would send them", async () => {
    const { fn, seen } = handler();
    for (const type of ["text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x"]) {
      const res = await fn(post({ "content-type": type }, '{"name":"x"}'), ctx());
      expect(res.status, type).toBe(415);
      expect((await errorOf(res)).issues.map((i) => i.path)).toEqual(["headers.content-type"]);
    }
    expect(seen).toEqual([]);
  });

  it("refuses a 6 MB JSON body (the default cap is 1 MB) with 413 naming the body", async () => {
    const { fn, seen } = handler();
    const res = await fn(post({}, JSON.stringify({ name: "x".repeat(6_000_000) })), ctx());
    expect(res.status).toBe(413);
    expect((await errorOf(res)).issues.map((i) => i.path)).toEqual([""]);
    expect(seen).toEqual([]);
  });

  it("stops reading a chunked 60 MB upload once it passes the route's cap, before parsing it", async () => {
    const MB = 1_000_000;
    let pulled = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        if (pulled >= 60) return controller.close();
        pulled++;
        controller.enqueue(new Uint8Array(MB));
      },
    });
    const init: RequestInit & { duplex: "half" } = { method: "POST", headers: { "content-type": "multipart/form-data; boundary=----x" }, body: stream, duplex: "half" };
    let parsed = false;
    const fn = route(
      async (req) => {
        readForm(req);
        parsed = true;
        return { ok: true };
      },
      { body: "multipart", maxBytes: 10 * MB + 64_000 },
    );
    const res = await fn(new Request(`${APP}/api/labs/kestrel-bay/chemicals/0b6f0c1e-4a51-4c8e-9d0a-000000000001/sds`, init), ctx({ lab: "kestrel-bay", chemicalId: "0b6f0c1e-4a51-4c8e-9d0a-000000000001" }));
    expect(res.status).toBe(413);
    expect(parsed).toBe(false);
    // 10 MB + 64 kB allowed: the 11th megabyte passes it; a few more may be in flight, never the whole 60.
    expect(pulled).toBeLessThan(15);
  });

  it("refuses JSON nested 100 levels deep, and NUL or a lone surrogate anywhere in the body, naming where", async () => {
    const { fn, seen } = handler();
    const deep = await fn(post({}, `${"[".repeat(100)}${"]".repeat(100)}`), ctx());
    expect(deep.status).toBe(422);
    const nul = await fn(post({}, JSON.stringify({ lines: [{ note: "ok" }, { note: "bad\u0000" }] })), ctx());
    expect((await errorOf(nul)).issues.map((i) => i.path)).toEqual(["lines.1.note"]);
    const surrogate = await fn(post({}, '{"name":"\\ud800"}'), ctx());
    expect((await errorOf(surrogate)).issues.map((i) => i.path)).toEqual(["name"]);
    expect(seen).toEqual([]);
  });
});

describe("path parameters", () => {
  it("a non-UUID id is a 422 naming the parameter; a malformed lab slug is a 404 naming lab", async () => {
    const { fn, seen } = handler();
    const bad = await fn(post({}), ctx({ lab: "kestrel-bay", chemicalId: "1 OR 1=1" }));
    expect(bad.status).toBe(422);
    expect((await errorOf(bad)).issues.map((i) => i.path)).toEqual(["chemicalId"]);
    const slug = await fn(post({}), ctx({ lab: "Kestrel\u0000Bay" }));
    expect(slug.status).toBe(422);
    expect((await errorOf(slug)).issues.map((i) => i.path)).toEqual(["lab"]);
    const upper = await fn(post({}), ctx({ lab: "../../etc" }));
    expect(upper.status).toBe(404);
    expect((await errorOf(upper)).issues.map((i) => i.path)).toEqual(["lab"]);
    expect(seen).toEqual([]);
  });
});

describe("the last resort", () => {
  it("a 500 carries a generic message and an error id, never the error's own (database) text", async () => {
    const fn = route(async () => {
      throw new Error('duplicate key value violates unique constraint "containers_lab_barcode"');
    });
    const original = console.error;
    const logged: unknown[][] = [];
    console.error = (...args: unknown[]) => void logged.push(args);
    try {
      const res = await fn(post({}), ctx());
      expect(res.status).toBe(500);
      const text = JSON.stringify(await res.json());
      expect(text).not.toMatch(/duplicate|constraint|containers_lab_barcode/);
      const { errorId } = JSON.parse(text).error as { errorId: string };
      expect(errorId).toMatch(/^[0-9a-f-]{36}$/);
      // The error itself is in the server log, under the same id.
      expect(String(logged[0]?.[0])).toContain(errorId);
    } finally {
      console.error = original;
    }
  });
});

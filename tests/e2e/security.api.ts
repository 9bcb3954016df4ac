/**
 * The running app's defences, over real HTTP: security headers, the cross-site request
 * guard (OWASP "Cross-Site Request Forgery Prevention Cheat Sheet": a cross-site form can
 * send text/plain with the victim's cookie; verifying Origin / Sec-Fetch-Site and
 * requiring application/json stops it), next-auth's credentials callback on GET, a
 * chunked oversized upload, and a password change ending the other sessions.
 */
import { expect, request as playwrightRequest, test, type APIRequestContext } from "@playwright/test";
import { DEMO, DEMO_PASSWORD } from "./support/auth";

const BASE = process.env.E2E_BASE_URL ?? "http://127.0.0.1:3000";
const LAB = "kestrel-bay";

async function signIn(request: APIRequestContext, email: string, password = DEMO_PASSWORD) {
  const { csrfToken } = (await (await request.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const res = await request.post("/api/auth/callback/credentials", { form: { csrfToken, email, password, json: "true" } });
  expect(res.ok()).toBe(true);
}

async function cookieHeader(request: APIRequestContext): Promise<string> {
  return (await request.storageState()).cookies.map((c) => `${c.name}=${c.value}`).join("; ");
}

test("every response carries the security headers (CSP, frames refused, nosniff, referrer and permissions policies)", async ({ request }) => {
  for (const path of ["/signin", "/api/health", `/api/labs/${LAB}/members`]) {
    const h = (await request.get(path, { maxRedirects: 0 })).headers();
    expect(h["content-security-policy"], path).toContain("frame-ancestors 'none'");
    expect(h["content-security-policy"], path).toContain("script-src 'self'");
    expect(h["content-security-policy"], path).toContain("object-src 'none'");
    expect(h["x-content-type-options"], path).toBe("nosniff");
    expect(h["x-frame-options"], path).toBe("DENY");
    expect(h["referrer-policy"], path).toBe("same-origin");
    expect(h["permissions-policy"], path).toContain("camera=()");
  }
});

test("a cross-site form post with the victim's cookie is refused and changes nothing; the app's own origin and scripts pass", async ({ request }) => {
  await signIn(request, DEMO.admin);
  const names = async () => ((await (await request.get(`/api/labs/${LAB}/locations`)).json()) as { locations: Array<{ name: string }> }).locations.map((l) => l.name);
  const before = await names();
  const name = `Origin test ${Date.now()}`;
  const body = JSON.stringify({ name });
  // What an attacker's page can send without a preflight: text/plain, from its own origin.
  const forged = await request.post(`/api/labs/${LAB}/locations`, { headers: { "content-type": "text/plain", origin: "https://evil.example", "sec-fetch-site": "cross-site" }, data: body });
  expect(forged.status()).toBe(403);
  expect(((await forged.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path)).toEqual(["headers.origin"]);
  // The same body as JSON from the foreign origin: still refused.
  expect((await request.post(`/api/labs/${LAB}/locations`, { headers: { "content-type": "application/json", origin: "https://evil.example" }, data: body })).status()).toBe(403);
  // text/plain without Origin (a script): refused for its content type.
  const plain = await request.post(`/api/labs/${LAB}/locations`, { headers: { "content-type": "text/plain" }, data: body });
  expect(plain.status()).toBe(415);
  expect(await names()).toEqual(before);
  // The app's own origin with JSON: accepted.
  const own = await request.post(`/api/labs/${LAB}/locations`, { headers: { "content-type": "application/json", origin: new URL(BASE).origin, "sec-fetch-site": "same-origin" }, data: body });
  expect(own.status()).toBe(201);
  expect(await names()).toContain(name);
});

test("GET on the credentials callback is a 405 naming the method, not a 500", async ({ request }) => {
  const res = await request.get("/api/auth/callback/credentials", { maxRedirects: 0 });
  expect(res.status()).toBe(405);
  const { error } = (await res.json()) as { error: { code: string; issues: Array<{ path: string }> } };
  expect(error.code).toBe("method_not_allowed");
  expect(error.issues.map((i) => i.path)).toEqual(["method"]);
});

test("a chunked 60 MB safety data sheet upload is refused with 413 while it streams", async ({ request }) => {
  await signIn(request, DEMO.admin);
  const chemicals = (await (await request.get(`/api/labs/${LAB}/chemicals`)).json()) as { chemicals: Array<{ id: string; sds: unknown }> };
  const chem = chemicals.chemicals[0]!;
  const MB = 1_000_000;
  let sent = 0;
  const prefix = new TextEncoder().encode('------fuzz\r\nContent-Disposition: form-data; name="file"; filename="big.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.7\n');
  const stream = new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(prefix);
    },
    pull(controller) {
      if (sent >= 60) return controller.close();
      sent++;
      controller.enqueue(new Uint8Array(MB).fill(0x20));
    },
  });
  const init: RequestInit & { duplex: "half" } = {
    method: "POST",
    headers: { cookie: await cookieHeader(request), "content-type": "multipart/form-data; boundary=----fuzz" },
    body: stream,
    duplex: "half",
  };
  const res = await fetch(`${BASE}/api/labs/${LAB}/chemicals/${chem.id}/sds`, init);
  expect(res.status).toBe(413);
  expect(((await res.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path)).toEqual([""]);
  // The server answered before the client had sent the whole body (the cap is 10 MB + 64 kB).
  expect(sent).toBeLessThan(60);
  const after = (await (await request.get(`/api/labs/${LAB}/chemicals`)).json()) as { chemicals: Array<{ id: string; sds: unknown }> };
  expect(after.chemicals.find((c) => c.id === chem.id)?.sds).toEqual(chem.sds);
});

test("a password change ends the user's other sessions and keeps the one that made it", async () => {
  const a = await playwrightRequest.newContext({ baseURL: BASE });
  const b = await playwrightRequest.newContext({ baseURL: BASE });
  const members = `/api/labs/${LAB}/members`;
  const newPassword = "another-long-password-for-the-test";
  try {
    await signIn(a, DEMO.safety);
    await signIn(b, DEMO.safety);
    expect((await b.get(members)).status()).toBe(200);
    const change = await a.post("/api/account/password", { data: { currentPassword: DEMO_PASSWORD, newPassword, confirmPassword: newPassword } });
    expect(change.status()).toBe(200);
    expect((await b.get(members)).status()).toBe(401);
    expect((await a.get(members)).status()).toBe(200);
    // Put the demo password back from the surviving session.
    expect((await a.post("/api/account/password", { data: { currentPassword: newPassword, newPassword: DEMO_PASSWORD, confirmPassword: DEMO_PASSWORD } })).status()).toBe(200);
    expect((await a.get(members)).status()).toBe(200);
    expect((await b.get(members)).status()).toBe(401);
  } finally {
    await a.dispose();
    await b.dispose();
  }
});

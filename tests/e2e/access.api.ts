import { expect, test, type APIRequestContext } from "@playwright/test";
import { DEMO, DEMO_PASSWORD } from "./support/auth";

/** HTTP status rules of the API: 401 without a session, 403 for a role that may not, 404 for another lab, 422 naming the field. */
async function signInApi(request: APIRequestContext, email: string) {
  const { csrfToken } = (await (await request.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const res = await request.post("/api/auth/callback/credentials", { form: { csrfToken, email, password: DEMO_PASSWORD, json: "true" } });
  expect(res.ok()).toBe(true);
}

test("no session: 401 with the error shape", async ({ request }) => {
  const res = await request.get("/api/labs/kestrel-bay/members");
  expect(res.status()).toBe(401);
  expect((await res.json()).error.code).toBe("unauthenticated");
});

test("chemist may read members but not invite: 403", async ({ request }) => {
  await signInApi(request, DEMO.chemist);
  expect((await request.get("/api/labs/kestrel-bay/members")).status()).toBe(200);
  const res = await request.post("/api/labs/kestrel-bay/members", { data: { email: "x@kestrelbay.example", role: "viewer" } });
  expect(res.status()).toBe(403);
});

test("another lab's members: 404", async ({ request }) => {
  await signInApi(request, DEMO.harrow);
  expect((await request.get("/api/labs/kestrel-bay/members")).status()).toBe(404);
});

test("bad input: 422 naming the field, nothing created", async ({ request }) => {
  await signInApi(request, DEMO.admin);
  const res = await request.post("/api/labs/kestrel-bay/members", { data: { email: "not-an-email", role: "wizard" } });
  expect(res.status()).toBe(422);
  const paths = ((await res.json()).error.issues as Array<{ path: string }>).map((i) => i.path).sort();
  expect(paths).toEqual(["email", "role"]);
});

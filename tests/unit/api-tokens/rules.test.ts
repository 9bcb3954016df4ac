import { describe, expect, it } from "vitest";
import { bearerCredentials, hashTokenSecret, newTokenSecret, parseTokenSecret, sameHash } from "@/lib/api-tokens/secret";
import { grantableTokenRoles, tokenState } from "@/lib/api-tokens/rules";
import { createApiTokenSchema } from "@/lib/api-tokens/schemas";
import { parseOrThrow } from "@/lib/errors/app-error";
import { invalidPaths } from "../../support/invalid-paths";

describe("token secrets", () => {
  it("hashes with SHA-256 (FIPS 180-2, Appendix B.1: the digest of \"abc\")", () => {
    expect(hashTokenSecret("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("a new secret is trl_ + 43 base64url characters (32 bytes, RFC 4648 §5), and parses back to its selector and hash", () => {
    const a = newTokenSecret();
    const b = newTokenSecret();
    expect(a.secret).toMatch(/^trl_[A-Za-z0-9_-]{43}$/);
    expect(a.secret).not.toBe(b.secret);
    expect(parseTokenSecret(a.secret)).toEqual({ selector: a.selector, hash: a.hash });
    expect(a.selector).toBe(a.secret.slice(0, 12));
  });

  it("refuses secrets of another shape", () => {
    for (const s of ["", "trl_", `trl_${"a".repeat(42)}`, `trl_${"a".repeat(44)}`, `TRL_${"a".repeat(43)}`, `trl_${"a".repeat(42)}=`, `abc_${"a".repeat(43)}`]) {
      expect(parseTokenSecret(s)).toBeNull();
    }
  });

  it("compares hashes of equal length only", () => {
    const h = hashTokenSecret("x");
    expect(sameHash(h, h)).toBe(true);
    expect(sameHash(h, hashTokenSecret("y"))).toBe(false);
    expect(sameHash(h, h.slice(0, 62))).toBe(false);
  });

  it("reads Bearer credentials; the scheme is case-insensitive (RFC 7235 §2.1, RFC 6750 §2.1)", () => {
    expect(bearerCredentials("Bearer trl_abc")).toBe("trl_abc");
    expect(bearerCredentials("bearer trl_abc")).toBe("trl_abc");
    expect(bearerCredentials("BEARER   trl_abc ")).toBe("trl_abc");
    expect(bearerCredentials("Basic dXNlcjpwYXNz")).toBeNull();
    expect(bearerCredentials(null)).toBeNull();
    // A Bearer header with nothing usable is still a Bearer attempt (refused later, never the session).
    expect(bearerCredentials("Bearer ")).toBe("");
  });
});

describe("token rules", () => {
  it("a lab admin may give a token any role whose permissions it holds; other roles only their own or less", () => {
    // Expected from the permission table in tests/unit/auth/permissions.test.ts (hand-written from PRODUCT.md):
    // the safety officer's review and hazard-threshold rights are not the lab admin's, so no lab admin hands them to a token.
    expect(grantableTokenRoles("lab_admin").sort()).toEqual(["chemist", "lab_admin", "stockkeeper", "viewer"]);
    expect(grantableTokenRoles("stockkeeper").sort()).toEqual(["stockkeeper"]); // a chemist plans, which a stockkeeper does not
    expect(grantableTokenRoles("chemist")).toEqual(["chemist"]);
  });

  it("revoked wins over expired; a token is expired from its expiry instant on", () => {
    const expiresAt = new Date("2026-12-31T12:00:00Z");
    expect(tokenState({ expiresAt, revokedAt: null }, new Date("2026-12-31T11:59:59Z"))).toBe("active");
    expect(tokenState({ expiresAt, revokedAt: null }, expiresAt)).toBe("expired");
    expect(tokenState({ expiresAt, revokedAt: new Date("2026-12-01T00:00:00Z") }, new Date("2026-12-02T00:00:00Z"))).toBe("revoked");
  });

  it("the create schema names every bad field", () => {
    const paths = (input: unknown) => invalidPaths(() => parseOrThrow(createApiTokenSchema, input)).sort();
    expect(paths({ name: "", role: "owner", expiresInDays: 0 })).toEqual(["expiresInDays", "name", "role"]);
    expect(paths({ name: "a\u0000b", role: "viewer", expiresInDays: 1.5 })).toEqual(["expiresInDays", "name"]);
    expect(paths({ name: "\ud800", role: "viewer", expiresInDays: 367 })).toEqual(["expiresInDays", "name"]);
    expect(paths({ name: "bell\u0007", role: "viewer", expiresInDays: 7 })).toEqual(["name"]);
    expect(parseOrThrow(createApiTokenSchema, { name: "  nightly export ", role: "viewer", expiresInDays: 366 })).toEqual({ name: "nightly export", role: "viewer", expiresInDays: 366 });
  });
});

import { describe, expect, it } from "vitest";
import { consumeSignInToken, createSignInToken } from "@/db/queries/sign-in-tokens";
import { signInTokens } from "@/db/schema";
import { useQueryLayerDatabase } from "@/tests/support/query-database";

const testDb = useQueryLayerDatabase();

describe("one-time sign-in tokens", () => {
  it("can be used once, and only before they expire", async () => {
    const inAMinute = new Date(Date.now() + 60_000);
    await createSignInToken({ email: "ana@example.org", tokenHash: "h1", expiresAt: inAMinute });
    expect(await consumeSignInToken({ tokenHash: "h1" })).toBe("ana@example.org");
    expect(await consumeSignInToken({ tokenHash: "h1" })).toBeNull();

    await createSignInToken({ email: "ana@example.org", tokenHash: "h2", expiresAt: inAMinute });
    expect(await consumeSignInToken({ tokenHash: "h2", now: new Date(Date.now() + 120_000) })).toBeNull();
    expect(await consumeSignInToken({ tokenHash: "unknown" })).toBeNull();
  });

  it("lets only one of two simultaneous uses succeed", async () => {
    await createSignInToken({ email: "bo@example.org", tokenHash: "race", expiresAt: new Date(Date.now() + 60_000) });
    const results = await Promise.all([consumeSignInToken({ tokenHash: "race" }), consumeSignInToken({ tokenHash: "race" })]);
    expect(results.filter((r) => r === "bo@example.org")).toHaveLength(1);
  });

  it("clears expired tokens when a new one is issued", async () => {
    await createSignInToken({ email: "old@example.org", tokenHash: "old", expiresAt: new Date(Date.now() - 1000) });
    await createSignInToken({ email: "new@example.org", tokenHash: "new", expiresAt: new Date(Date.now() + 60_000) });
    const hashes = (await testDb().db.select().from(signInTokens)).map((r) => r.tokenHash);
    expect(hashes).not.toContain("old");
    expect(hashes).toContain("new");
  });
});

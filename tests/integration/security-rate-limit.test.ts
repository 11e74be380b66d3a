import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDatabase, type Database } from "@/db/client";
import { setDatabase } from "@/db/queries/connection";
import { countAttempt } from "@/db/queries/rate-limits";
import { checkRateLimit, clientAddress, RATE_LIMITS, refundAttempt } from "@/server/auth/rate-limit";
import { createTestDatabase, type TestDatabase } from "@/tests/support/database";

let t: TestDatabase;
let second: Database;
beforeAll(async () => {
  t = await createTestDatabase();
  setDatabase(t.db);
  second = createDatabase(t.url);
});
afterAll(() => {
  second.$client.close();
  setDatabase(null);
  t.cleanup();
});

const NOW = new Date("2026-12-03T10:00:00Z");
const at = (seconds: number) => new Date(NOW.getTime() + seconds * 1000);

async function attempts(n: number, args: Parameters<typeof checkRateLimit>[0]) {
  const out = [];
  for (let i = 0; i < n; i++) out.push(await checkRateLimit(args));
  return out;
}

describe("rate limits on sign-in and sign-in links (probe item 8)", () => {
  it("allows 10 password attempts per account in 15 minutes, refuses the 11th with the seconds left, and the same for an address with no account", async () => {
    for (const email of ["ines@kestrel-lab.example", "nobody-here@kestrel-lab.example"]) {
      const decisions = await attempts(11, { action: "sign-in", email, address: null, now: at(60) });
      expect(decisions.slice(0, 10).every((d) => d.allowed)).toBe(true);
      // The window opened at +60 s and lasts 900 s; the refusal comes at +60 s: 900 s left.
      expect(decisions[10]).toEqual({ allowed: false, limitedBy: "account", retryAfterSeconds: 900 });
    }
    const later = await checkRateLimit({ action: "sign-in", email: "INES@kestrel-lab.example ", address: null, now: at(60 + 600) });
    expect(later).toEqual({ allowed: false, limitedBy: "account", retryAfterSeconds: 300 });
    const nextWindow = await checkRateLimit({ action: "sign-in", email: "ines@kestrel-lab.example", address: null, now: at(60 + 900) });
    expect(nextWindow).toEqual({ allowed: true });
  });

  it("limits one client address across many accounts (30 sign-in attempts, 10 link requests)", async () => {
    const address = "203.0.113.7"; // RFC 5737 documentation address
    const signIns = [];
    for (let i = 0; i < 31; i++) signIns.push(await checkRateLimit({ action: "sign-in", email: `guess${i}@example.org`, address, now: NOW }));
    expect(signIns.filter((d) => d.allowed)).toHaveLength(30);
    expect(signIns[30]).toMatchObject({ allowed: false, limitedBy: "address" });
    const links = [];
    for (let i = 0; i < 11; i++) links.push(await checkRateLimit({ action: "link", email: `victim${i}@example.org`, address, now: NOW }));
    expect(links.filter((d) => d.allowed)).toHaveLength(10);
    expect(links[10]).toMatchObject({ allowed: false, limitedBy: "address" });
  });

  it("allows 3 sign-in links per account in 15 minutes", async () => {
    const decisions = await attempts(4, { action: "link", email: "sam@kestrel-lab.example", address: "198.51.100.1", now: NOW });
    expect(decisions.map((d) => d.allowed)).toEqual([true, true, true, false]);
    expect(RATE_LIMITS.link.account).toBe(3);
  });

  it("a successful sign-in gives its attempt back, so only failures add up", async () => {
    const args = { action: "sign-in" as const, email: "priya@kestrel-lab.example", address: "198.51.100.2", now: NOW };
    for (let i = 0; i < 25; i++) {
      expect((await checkRateLimit(args)).allowed).toBe(true);
      await refundAttempt(args);
    }
  });

  it("two app processes on one database share the count", async () => {
    const key = "sign-in:account:shared@example.org";
    const counts = [];
    for (let i = 0; i < 6; i++) counts.push((await countAttempt({ db: i % 2 === 0 ? t.db : second, key, windowMs: 60_000, now: NOW })).count);
    expect(counts).toEqual([1, 2, 3, 4, 5, 6]);
  });

  it("reads the client address from the last X-Forwarded-For entry (the one the nearest proxy added)", () => {
    expect(clientAddress(new Headers({ "x-forwarded-for": "10.0.0.1, 203.0.113.9" }))).toBe("203.0.113.9");
    expect(clientAddress(new Headers({ "x-real-ip": "203.0.113.10" }))).toBe("203.0.113.10");
    expect(clientAddress(new Headers())).toBeNull();
  });
});

import { describe, expect, it } from "vitest";
import { formatDate } from "./formatDate";
import { power } from "./guarantee";

describe("formatDate", () => {
  it("writes day, month, year and UTC time, whatever the server's zone", () => {
    expect(formatDate(new Date("2026-12-03T10:36:45Z"))).toBe("3 Dec 2026, 10:36 UTC");
    expect(formatDate(new Date("2027-01-09T23:05:00-02:00"))).toBe("10 Jan 2027, 01:05 UTC");
  });
});

describe("power", () => {
  it("writes P to the 7th and 12th power with superscript digits, an unknown power as ^k", () => {
    expect(power("P", 7)).toBe("P⁷");
    expect(power("P", 12)).toBe("P¹²");
    expect(power("P", null)).toBe("P^k");
  });
});

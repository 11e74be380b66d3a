import { describe, expect, it } from "vitest";
import { distinctNames } from "./distinctNames";

describe("distinctNames", () => {
  it("keeps a unique name as it is and tells shared names apart by kind and content address", () => {
    const labels = distinctNames([
      { id: "1", name: "ECA 110", kind: "eca", address: "sha256:aaaa1111bbbb" },
      { id: "2", name: "Markov chain (3 states)", kind: "markov", address: "sha256:0123456789ab" },
      { id: "3", name: "markov chain (3 STATES)", kind: "markov", address: "sha256:fedcba987654" },
    ]).map((m) => m.label);
    expect(labels).toEqual(["ECA 110", "Markov chain (3 states) (markov, 01234567)", "markov chain (3 STATES) (markov, fedcba98)"]);
  });

  it("falls back to the id when no address is known", () => {
    expect(distinctNames([{ id: "abcdef123456", name: "x" }, { id: "999999999999", name: "x" }]).map((m) => m.label)).toEqual(["x (abcdef12)", "x (99999999)"]);
  });
});

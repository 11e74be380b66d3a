import { describe, expect, it } from "vitest";
import { ACTIONS, LEAST_ROLE, ROLES, can, isRoleWithin, refusalReason } from "./index";

describe("the role policy", () => {
  it("lets a viewer read the atlas but not submit a certificate", () => {
    expect(can("viewer", "atlas:read")).toBe(true);
    expect(can("viewer", "certificate:submit")).toBe(false);
  });

  it("lets only curators and admins retract a map", () => {
    expect(ROLES.filter((r) => can(r, "map:retract"))).toEqual(["curator", "admin"]);
  });

  it("refuses everything to someone without a role", () => {
    for (const action of ACTIONS) expect(can(null, action)).toBe(false);
  });

  it("is monotone: a higher role may do all that a lower one may", () => {
    for (const action of ACTIONS)
      for (let i = 0; i + 1 < ROLES.length; i++)
        if (can(ROLES[i], action)) expect(can(ROLES[i + 1], action)).toBe(true);
  });

  it("names the needed role when it refuses", () => {
    expect(refusalReason("viewer", "certificate:submit")).toContain(LEAST_ROLE["certificate:submit"]);
  });

  it("never lets a grant exceed the owner's role", () => {
    expect(isRoleWithin("contributor", "curator")).toBe(true);
    expect(isRoleWithin("admin", "contributor")).toBe(false);
  });
});

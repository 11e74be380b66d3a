import { describe, expect, it } from "vitest";
import { ACTIONS, ACTION_WORDS, ROLES, can, isRoleWithin, refusalReason, type Role } from "./index";

/**
 * The role table pinned action by action, written out here (README "Roles": viewer < contributor <
 * curator < admin) rather than read from LEAST_ROLE: a test that derives its expectations from the
 * table it tests passes whatever the table says. A new action must be added here too.
 */
const MAY: Record<string, Role[]> = {
  "atlas:read": ["viewer", "contributor", "curator", "admin"],
  "watch:manage": ["viewer", "contributor", "curator", "admin"],
  "token:manage": ["viewer", "contributor", "curator", "admin"],
  "note:post": ["contributor", "curator", "admin"],
  "model:create": ["contributor", "curator", "admin"],
  "certificate:submit": ["contributor", "curator", "admin"],
  "chain:submit": ["contributor", "curator", "admin"],
  "search:run": ["contributor", "curator", "admin"],
  "job:create": ["contributor", "curator", "admin"],
  "job:cancel-own": ["contributor", "curator", "admin"],
  "map:retract": ["curator", "admin"],
  "job:cancel-any": ["admin"],
  "member:manage": ["admin"],
  "member:invite": ["admin"],
  "invitation:revoke": ["admin"],
  "member:change-role": ["admin"],
  "member:remove": ["admin"],
  "workspace:publish": ["admin"],
  "outbox:manage": ["admin"],
  "audit:browse": ["admin"],
  "annotation:note": ["contributor", "curator", "admin"],
  "annotation:tag": ["contributor", "curator", "admin"],
  "map:mark-published": ["contributor", "curator", "admin"],
};

describe("the role policy, pinned action by action", () => {
  it("has exactly the pinned actions (a new action needs its row here)", () => {
    expect([...ACTIONS].sort()).toEqual(Object.keys(MAY).sort());
    expect([...ROLES]).toEqual(["viewer", "contributor", "curator", "admin"]);
  });

  for (const [action, roles] of Object.entries(MAY))
    it(`lets exactly ${roles.join(", ")} perform ${action}`, () => {
      for (const role of ROLES) expect(can(role, action as (typeof ACTIONS)[number]), `${role} ${action}`).toBe(roles.includes(role));
    });

  it("refuses everything to someone without a role", () => {
    for (const action of ACTIONS) {
      expect(can(null, action)).toBe(false);
      expect(can(undefined, action)).toBe(false);
    }
  });

  it("names the needed role when it refuses, in plain words", () => {
    expect(refusalReason("viewer", "certificate:submit")).toBe("Your role is viewer; to submit a certificate you need the contributor role or higher.");
    expect(refusalReason("curator", "member:manage")).toBe("Your role is curator; to manage members you need the admin role or higher.");
    expect(refusalReason(null, "map:retract")).toBe("You are not a member of this workspace; to retract a map you need the curator role.");
  });

  it("describes every action in words, never by its identifier", () => {
    expect(Object.keys(ACTION_WORDS).sort()).toEqual([...ACTIONS].sort());
    for (const action of ACTIONS) {
      expect(ACTION_WORDS[action], action).not.toContain(":");
      expect(refusalReason("viewer", action), action).not.toContain(action);
    }
  });

  it("never lets a grant exceed the owner's role", () => {
    expect(isRoleWithin("contributor", "curator")).toBe(true);
    expect(isRoleWithin("curator", "curator")).toBe(true);
    expect(isRoleWithin("admin", "contributor")).toBe(false);
    expect(isRoleWithin("contributor", "viewer")).toBe(false);
  });
});

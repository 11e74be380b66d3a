/**
 * Who may do what in a workspace. The one table every server action and route handler consults;
 * the proxy only redirects signed-out visitors and decides nothing.
 */
export const ROLES = ["viewer", "contributor", "curator", "admin"] as const;
export type Role = (typeof ROLES)[number];

export const ACTIONS = [
  "atlas:read",
  "watch:manage",
  "token:manage",
  "note:post",
  "model:create",
  "certificate:submit",
  "chain:submit",
  "search:run",
  "job:create",
  "job:cancel-own",
  "map:retract",
  "job:cancel-any",
  "member:manage",
  "member:invite",
  "invitation:revoke",
  "member:change-role",
  "member:remove",
  "workspace:publish",
  "outbox:manage",
  "audit:browse",
  "annotation:note",
  "annotation:tag",
  "map:mark-published",
] as const;
export type Action = (typeof ACTIONS)[number];

/** The least role that may perform each action; roles are ordered viewer < contributor < curator < admin. */
export const LEAST_ROLE: Record<Action, Role> = {
  "atlas:read": "viewer",
  "watch:manage": "viewer",
  "token:manage": "viewer",
  "note:post": "contributor",
  "model:create": "contributor",
  "certificate:submit": "contributor",
  "chain:submit": "contributor",
  "search:run": "contributor",
  "job:create": "contributor",
  "job:cancel-own": "contributor",
  "map:retract": "curator",
  "job:cancel-any": "admin",
  "member:manage": "admin",
  "member:invite": "admin",
  "invitation:revoke": "admin",
  "member:change-role": "admin",
  "member:remove": "admin",
  "workspace:publish": "admin",
  "outbox:manage": "admin",
  "audit:browse": "admin",
  "annotation:note": "contributor",
  "annotation:tag": "contributor",
  "map:mark-published": "contributor",
};

export function roleRank(role: Role): number {
  return ROLES.indexOf(role);
}

export function can(role: Role | null | undefined, action: Action): boolean {
  if (!role) return false;
  return roleRank(role) >= roleRank(LEAST_ROLE[action]);
}

/** A human sentence for a 403 page or a JSON error: why the action was refused. */
export function refusalReason(role: Role | null | undefined, action: Action): string {
  const needed = LEAST_ROLE[action];
  if (!role) return `You are not a member of this workspace; "${action}" needs the ${needed} role.`;
  return `Your role is ${role}; "${action}" needs the ${needed} role or higher.`;
}

/** A token or delegated role may never exceed the role of the person who grants it. */
export function isRoleWithin(granted: Role, owner: Role): boolean {
  return roleRank(granted) <= roleRank(owner);
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

export { isUnsubscribeToken, unsubscribeToken, unsubscribeUrl } from "./unsubscribeToken";

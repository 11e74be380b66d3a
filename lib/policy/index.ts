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

/**
 * What each action lets a person do, in plain words: every place that names an action to a person
 * (403 page, refusal sentences, token settings) says this, never the identifier.
 */
export const ACTION_WORDS: Record<Action, string> = {
  "atlas:read": "read the atlas",
  "watch:manage": "manage your watches and notifications",
  "token:manage": "manage your API tokens",
  "note:post": "post a note to the team log",
  "model:create": "add a model",
  "certificate:submit": "submit a certificate",
  "chain:submit": "submit a Markov chain",
  "search:run": "run a search",
  "job:create": "start a job",
  "job:cancel-own": "cancel your own jobs",
  "map:retract": "retract a map",
  "job:cancel-any": "cancel anyone's job",
  "member:manage": "manage members",
  "member:invite": "invite members",
  "invitation:revoke": "revoke an invitation",
  "member:change-role": "change a member's role",
  "member:remove": "remove a member",
  "workspace:publish": "publish the workspace",
  "outbox:manage": "manage the mail outbox",
  "audit:browse": "browse the audit log",
  "annotation:note": "add a note to a model or map",
  "annotation:tag": "tag a model or map",
  "map:mark-published": "mark a map as published",
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
  const words = ACTION_WORDS[action];
  if (!role) return `You are not a member of this workspace; to ${words} you need the ${needed} role.`;
  return `Your role is ${role}; to ${words} you need the ${needed} role or higher.`;
}

/** A token or delegated role may never exceed the role of the person who grants it. */
export function isRoleWithin(granted: Role, owner: Role): boolean {
  return roleRank(granted) <= roleRank(owner);
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

export { isUnsubscribeToken, unsubscribeToken, unsubscribeUrl } from "./unsubscribeToken";

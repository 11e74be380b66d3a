import "server-only";
import { and, asc, eq, inArray, or, sql } from "drizzle-orm";
import {
  chainLinks,
  maps,
  memberships,
  models,
  notificationOutbox,
  notifications,
  users,
  watchRules,
  watches,
  type MODEL_KINDS,
  type Watch,
  type WATCH_SCOPES,
  type WatchRule,
} from "@/db/schema";
import { env } from "@/env";
import { unsubscribeUrl } from "@/lib/policy";
import { type Executor, getDatabase, withDb } from "./connection";

type ModelKind = (typeof MODEL_KINDS)[number];

/** One person and one model of a workspace: what every watch query is about. */
type WatchTarget = { db?: Executor; workspaceId: string; userId: string; modelId: string };

/** Starts watching a model of the workspace; watching twice is the same watch. Returns null when the model is not in the workspace. */
export async function watchModel({
  db = getDatabase(),
  workspaceId,
  userId,
  modelId,
}: WatchTarget): Promise<Watch | null> {
  return withDb("watching a model", async () => {
    const [model] = await db
      .select({ id: models.id })
      .from(models)
      .where(and(eq(models.id, modelId), eq(models.workspaceId, workspaceId)))
      .limit(1);
    if (!model) return null;
    await db.insert(watches).values({ workspaceId, userId, modelId }).onConflictDoNothing();
    const [row] = await db
      .select()
      .from(watches)
      .where(and(eq(watches.userId, userId), eq(watches.modelId, modelId)))
      .limit(1);
    return row ?? null;
  });
}

/** Stops watching; returns whether a watch existed. */
export async function unwatchModel({
  db = getDatabase(),
  workspaceId,
  userId,
  modelId,
}: WatchTarget): Promise<boolean> {
  return withDb("unwatching a model", async () => {
    const removed = await db
      .delete(watches)
      .where(and(eq(watches.workspaceId, workspaceId), eq(watches.userId, userId), eq(watches.modelId, modelId)))
      .returning({ id: watches.id });
    return removed.length > 0;
  });
}

/** Whether the user watches the model, and how many people do. */
export async function getWatchState({
  db = getDatabase(),
  workspaceId,
  userId,
  modelId,
}: WatchTarget): Promise<{ watching: boolean; watchers: number }> {
  return withDb("reading watchers", async () => {
    const [row] = await db
      .select({
        watchers: sql<number>`count(*)`,
        watching: sql<number>`coalesce(sum(${watches.userId} = ${userId}), 0)`,
      })
      .from(watches)
      .where(and(eq(watches.workspaceId, workspaceId), eq(watches.modelId, modelId)));
    return { watching: Number(row?.watching ?? 0) > 0, watchers: Number(row?.watchers ?? 0) };
  });
}

/** The models a user watches in a workspace, oldest watch first. */
export async function listWatchedModels({
  db = getDatabase(),
  workspaceId,
  userId,
}: {
  db?: Executor;
  workspaceId: string;
  userId: string;
}): Promise<{ modelId: string; name: string; kind: string; since: Date }[]> {
  return withDb("listing watched models", () =>
    db
      .select({ modelId: models.id, name: models.name, kind: models.kind, since: watches.createdAt })
      .from(watches)
      .innerJoin(models, eq(models.id, watches.modelId))
      .where(and(eq(watches.workspaceId, workspaceId), eq(watches.userId, userId)))
      .orderBy(asc(watches.createdAt)),
  );
}

export type WatchScope = (typeof WATCH_SCOPES)[number];
export type WatchRuleInput = { workspaceId: string; userId: string; scope: WatchScope; modelKind?: ModelKind | null; modelId?: string | null };

/** Starts a class or saved-search watch; the same watch twice is one row. Null when the model is not in the workspace. */
export async function addWatchRule({ db = getDatabase(), ...rule }: WatchRuleInput & { db?: Executor }): Promise<WatchRule | null> {
  return withDb("saving a watch", async () => {
    if (rule.scope === "class" ? !rule.modelKind : !rule.modelId) return null;
    if (rule.modelId) {
      const [model] = await db
        .select({ id: models.id })
        .from(models)
        .where(and(eq(models.id, rule.modelId), eq(models.workspaceId, rule.workspaceId)))
        .limit(1);
      if (!model) return null;
    }
    const existing = await findRule(db, rule);
    if (existing) return existing;
    const values = { workspaceId: rule.workspaceId, userId: rule.userId, scope: rule.scope, modelKind: rule.scope === "class" ? rule.modelKind! : null, modelId: rule.scope === "class" ? null : rule.modelId! };
    const [row] = await db.insert(watchRules).values(values).returning();
    return row;
  });
}

async function findRule(db: Executor, rule: WatchRuleInput): Promise<WatchRule | undefined> {
  const [row] = await db
    .select()
    .from(watchRules)
    .where(
      and(
        eq(watchRules.workspaceId, rule.workspaceId),
        eq(watchRules.userId, rule.userId),
        eq(watchRules.scope, rule.scope),
        rule.scope === "class" ? eq(watchRules.modelKind, rule.modelKind!) : eq(watchRules.modelId, rule.modelId!),
      ),
    )
    .limit(1);
  return row;
}

export async function removeWatchRule({ db = getDatabase(), workspaceId, userId, id }: { db?: Executor; workspaceId: string; userId: string; id: string }): Promise<boolean> {
  return withDb("removing a watch", async () => {
    const rows = await db
      .delete(watchRules)
      .where(and(eq(watchRules.id, id), eq(watchRules.workspaceId, workspaceId), eq(watchRules.userId, userId)))
      .returning({ id: watchRules.id });
    return rows.length > 0;
  });
}

export type WatchView = { id: string; userId: string; userName: string; scope: "model" | WatchScope; modelKind: string | null; modelId: string | null; modelName: string | null };

/** Who watches what in a workspace (every member's model watches and rules), or one person's. */
export async function listWorkspaceWatches({ db = getDatabase(), workspaceId, userId }: { db?: Executor; workspaceId: string; userId?: string }): Promise<WatchView[]> {
  return withDb("listing watches", async () => {
    const byModel = await db
      .select({ id: watches.id, userId: watches.userId, userName: users.name, modelId: watches.modelId, modelName: models.name })
      .from(watches)
      .innerJoin(users, eq(users.id, watches.userId))
      .innerJoin(models, eq(models.id, watches.modelId))
      .where(and(eq(watches.workspaceId, workspaceId), userId ? eq(watches.userId, userId) : undefined));
    const rules = await db
      .select({ id: watchRules.id, userId: watchRules.userId, userName: users.name, scope: watchRules.scope, modelKind: watchRules.modelKind, modelId: watchRules.modelId, modelName: models.name })
      .from(watchRules)
      .innerJoin(users, eq(users.id, watchRules.userId))
      .leftJoin(models, eq(models.id, watchRules.modelId))
      .where(and(eq(watchRules.workspaceId, workspaceId), userId ? eq(watchRules.userId, userId) : undefined));
    return [
      ...byModel.map((w) => ({ ...w, scope: "model" as const, modelKind: null })),
      ...rules.map((r) => ({ ...r })),
    ].sort((a, b) => a.userName.localeCompare(b.userName) || a.id.localeCompare(b.id));
  });
}

/** What a watch covers, in words: "ECA 128", "every ECA", "anything that coarse-grains onto ECA 128". */
export function describeWatch(w: Pick<WatchView, "scope" | "modelKind" | "modelName">): string {
  if (w.scope === "model") return w.modelName ?? "a model";
  if (w.scope === "class") return `every ${KIND_WORDS[w.modelKind ?? ""] ?? w.modelKind}`;
  if (w.scope === "onto") return `anything that coarse-grains onto ${w.modelName}`;
  return `any lumping of ${w.modelName}`;
}

const KIND_WORDS: Record<string, string> = {
  eca: "ECA",
  markov: "Markov chain",
  ca: "cellular automaton",
  supercell: "supercell",
  "decimated-chain": "decimated chain",
  iterate: "iterate",
};

export type CertifiedMapEvent = {
  /** A map, or a chain (a proof through several maps) from its first source to its last target. */
  subject?: "map" | "chain";
  workspaceId: string;
  actorId: string | null;
  map: { id: string; kind: string; block: number | null; steps: number | null; summary: string };
  source: { id: string; kind: string; name: string };
  target: { id: string; kind: string; name: string };
  certificateAddress: string;
  /** The certificate's canonical JSON; the partition of a lumping is read from it. */
  certificateBody: string;
  linkBase: string;
  /** The one-click unsubscribe address of a person (signed); null leaves the header out. */
  unsubscribeLink: ((userId: string) => string) | null;
};

/** The people who watch something this map matches (members of the workspace only), the actor excepted. */
async function matchingWatchers(db: Executor, e: CertifiedMapEvent) {
  const byModel = db
    .select({ userId: watches.userId })
    .from(watches)
    .where(and(eq(watches.workspaceId, e.workspaceId), inArray(watches.modelId, [e.source.id, e.target.id])));
  const byRule = ruleWatchers(db, e.workspaceId, { kind: e.subject === "chain" ? "chain" : e.map.kind, source: e.source, target: e.target });
  const ids = new Set([...(await byModel.all()), ...(await byRule.all())].map((r) => r.userId));
  if (e.actorId) ids.delete(e.actorId);
  return membersAmong(db, e.workspaceId, ids);
}

/** The saved watches a map matches: a class of either end, "onto" its target, "any lumping of" its source. */
function ruleWatchers(db: Executor, workspaceId: string, m: { kind: string; source: { id: string; kind: string }; target: { id: string; kind: string } }) {
  const ruleMatches = [
    and(eq(watchRules.scope, "class"), inArray(watchRules.modelKind, [m.source.kind, m.target.kind] as ModelKind[])),
    and(eq(watchRules.scope, "onto"), eq(watchRules.modelId, m.target.id)),
  ];
  if (m.kind === "lumping") ruleMatches.push(and(eq(watchRules.scope, "lumping-of"), eq(watchRules.modelId, m.source.id)));
  return db
    .select({ userId: watchRules.userId })
    .from(watchRules)
    .where(and(eq(watchRules.workspaceId, workspaceId), or(...ruleMatches)));
}

/** Those of the people who are members of the workspace (someone who left hears nothing), with their mail choice. */
async function membersAmong(db: Executor, workspaceId: string, ids: Set<string>) {
  if (ids.size === 0) return [];
  return db
    .select({ userId: users.id, email: users.email, delivery: memberships.mailDelivery })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.workspaceId, workspaceId), inArray(memberships.userId, [...ids])))
    .all();
}

function partitionOf(body: string): number[] | null {
  try {
    const parsed = JSON.parse(body) as { map?: { partition?: unknown } };
    const p = parsed.map?.partition;
    return Array.isArray(p) && p.every((x) => typeof x === "number") ? (p as number[]) : null;
  } catch {
    return null;
  }
}

function pagePath(e: CertifiedMapEvent): string {
  return e.subject === "chain" ? `/chains/${e.map.id}` : `/atlas/maps/${e.map.id}`;
}

/** "ECA 146 → ECA 128, projection at block 3" and the lines of the mail. */
/**
 * What a projection is, so that two maps between the same models read apart in a mail: the coarse
 * symbol of each block state, states 0…0 to 1…1 in order; null for other kinds.
 */
function projectionLine(certificateBody: string): string | null {
  try {
    const map = (JSON.parse(certificateBody) as { map?: { projection?: unknown } }).map;
    if (Array.isArray(map?.projection)) return `Projection (coarse symbol of each block state, 0…0 first): ${map.projection.join("")}`;
  } catch {
    // a body that is not JSON has no definition to show
  }
  return null;
}

export function certifiedMapText(e: CertifiedMapEvent, actorName: string) {
  const partition = partitionOf(e.certificateBody);
  const shape = partition ? `Partition: ${JSON.stringify(partition)}` : e.map.block ? `Block size: ${e.map.block}` : e.map.steps ? `Steps: ${e.map.steps}` : null;
  const title =
    e.subject === "chain"
      ? `${e.source.name} → ${e.target.name}, chain “${e.map.summary}”`
      : `${e.source.name} → ${e.target.name}, ${e.map.kind}${e.map.block ? ` at block ${e.map.block}` : ""}`;
  const link = `${e.linkBase}${pagePath(e)}`;
  const body = [
    `${actorName} certified ${title}.`,
    "",
    `What: ${e.map.summary}`,
    `By: ${actorName}`,
    ...(shape ? [shape] : []),
    ...(projectionLine(e.certificateBody) ? [projectionLine(e.certificateBody)] : []),
    `Certificate: ${e.certificateAddress}`,
    "",
    `Open the certificate page: ${link}`,
  ];
  return { title, body: body.join("\n"), link };
}

/**
 * One in-app notification per matching watcher, and one mail each to those who chose immediate
 * mail (digest readers get it in their daily digest; unsubscribed ones get none). Runs inside the
 * caller's transaction, so nothing is announced for a write that rolls back.
 */
export async function notifyWatchersOfMap(db: Executor, e: CertifiedMapEvent): Promise<number> {
  const watchers = await matchingWatchers(db, e);
  if (watchers.length === 0) return 0;
  const [actor] = e.actorId ? await db.select({ name: users.name }).from(users).where(eq(users.id, e.actorId)).limit(1) : [];
  const text = certifiedMapText(e, actor?.name ?? "Someone");
  await db.insert(notifications).values(
    watchers.map((w) => ({
      workspaceId: e.workspaceId,
      userId: w.userId,
      mapId: e.subject === "chain" ? null : e.map.id,
      title: `${actor?.name ?? "Someone"} certified ${text.title}`,
      body: text.body,
      link: pagePath(e),
      // Only what happens while someone reads digests goes into a digest.
      digestedAt: w.delivery === "digest" ? null : new Date(),
    })),
  );
  const immediate = watchers.filter((w) => w.delivery === "immediate");
  if (immediate.length > 0)
    await db.insert(notificationOutbox).values(
      immediate.map((w) => {
        const unsubscribe = e.unsubscribeLink?.(w.userId) ?? null;
        return {
          workspaceId: e.workspaceId,
          userId: w.userId,
          toAddress: w.email,
          subject: `Certified: ${text.title}`,
          body: unsubscribe ? `${text.body}\n\nStop these mails with one click: ${unsubscribe}\n` : `${text.body}\n`,
          mapId: e.subject === "chain" ? null : e.map.id,
          unsubscribeUrl: unsubscribe,
        };
      }),
    );
  return watchers.length;
}

/** The title of every retraction notification starts with this (the digest counts them apart). */
export const RETRACTION_TITLE = "Map retracted: ";

/**
 * Who hears of a retraction: everyone who watches the map — its models, a class or saved search it
 * matches — and everyone who was told of it or of a chain citing it (their watch may have changed
 * since). Members only, the actor excepted, each person once.
 */
async function retractionRecipients(db: Executor, r: { workspaceId: string; mapId: string; modelIds: string[]; exceptUserId: string | null }) {
  const byModel = db
    .select({ userId: watches.userId })
    .from(watches)
    .where(and(eq(watches.workspaceId, r.workspaceId), inArray(watches.modelId, r.modelIds)));
  const [map] = await db
    .select({ kind: maps.kind, sourceId: maps.sourceModelId, targetId: maps.targetModelId })
    .from(maps)
    .where(and(eq(maps.workspaceId, r.workspaceId), eq(maps.id, r.mapId)))
    .limit(1);
  const ends = map ? await db.select({ id: models.id, kind: models.kind }).from(models).where(inArray(models.id, [map.sourceId, map.targetId])) : [];
  const source = ends.find((x) => x.id === map?.sourceId);
  const target = ends.find((x) => x.id === map?.targetId);
  const byRule = map && source && target ? await ruleWatchers(db, r.workspaceId, { kind: map.kind, source, target }).all() : [];
  const citing = db.select({ link: sql<string>`'/chains/' || ${chainLinks.chainId}` }).from(chainLinks).where(eq(chainLinks.mapId, r.mapId));
  const told = db
    .select({ userId: notifications.userId })
    .from(notifications)
    .where(and(eq(notifications.workspaceId, r.workspaceId), or(eq(notifications.mapId, r.mapId), inArray(notifications.link, citing))));
  const ids = new Set([...(await byModel.all()), ...byRule, ...(await told.all())].map((x) => x.userId));
  if (r.exceptUserId) ids.delete(r.exceptUserId);
  return membersAmong(db, r.workspaceId, ids);
}

/**
 * A retraction, told to everyone who watches the map (see retractionRecipients): one in-app
 * notification each, and one mail each to those who chose immediate mail (digest readers find it in
 * their digest; those who turned mail off get none). Runs inside the caller's transaction.
 */
export async function notifyWatchers({
  db,
  workspaceId,
  modelIds,
  exceptUserId,
  mapId,
  subject,
  body,
}: {
  db: Executor;
  workspaceId: string;
  modelIds: string[];
  exceptUserId: string | null;
  mapId: string;
  subject: string;
  body: string;
}): Promise<number> {
  const watchers = await retractionRecipients(db, { workspaceId, mapId, modelIds, exceptUserId });
  if (watchers.length === 0) return 0;
  const title = subject.startsWith(RETRACTION_TITLE) ? subject : `${RETRACTION_TITLE}${subject}`;
  await db.insert(notifications).values(
    watchers.map((w) => ({ workspaceId, userId: w.userId, mapId, title, body, link: `/atlas/maps/${mapId}`, digestedAt: w.delivery === "digest" ? null : new Date() })),
  );
  const immediate = watchers.filter((w) => w.delivery === "immediate");
  if (immediate.length > 0)
    await db.insert(notificationOutbox).values(
      immediate.map((w) => {
        const unsubscribe = unsubscribeUrl({ appUrl: env.APP_URL, secret: env.AUTH_SECRET, workspaceId, userId: w.userId });
        return { workspaceId, userId: w.userId, toAddress: w.email, subject, body: `${body}\nStop these mails with one click: ${unsubscribe}\n`, mapId, unsubscribeUrl: unsubscribe };
      }),
    );
  return watchers.length;
}

/**
 * A stored chain announced like a map: from the first link's source to the last link's target, to
 * the watchers of either model, of their classes, or of anything onto the target.
 */
export async function notifyWatchersOfChain(
  db: Executor,
  c: { workspaceId: string; actorId: string | null; chainId: string; name: string; firstMapId: string; lastMapId: string; certificateAddress: string; certificateBody: string },
): Promise<number> {
  const [first] = await db.select({ id: models.id, kind: models.kind, name: models.name }).from(maps).innerJoin(models, eq(models.id, maps.sourceModelId)).where(eq(maps.id, c.firstMapId)).limit(1);
  const [last] = await db.select({ id: models.id, kind: models.kind, name: models.name }).from(maps).innerJoin(models, eq(models.id, maps.targetModelId)).where(eq(maps.id, c.lastMapId)).limit(1);
  if (!first || !last) return 0;
  return notifyWatchersOfMap(db, {
    subject: "chain",
    workspaceId: c.workspaceId,
    actorId: c.actorId,
    map: { id: c.chainId, kind: "chain", block: null, steps: null, summary: c.name },
    source: first,
    target: last,
    certificateAddress: c.certificateAddress,
    certificateBody: c.certificateBody,
    linkBase: env.APP_URL,
    unsubscribeLink: (userId) => unsubscribeUrl({ appUrl: env.APP_URL, secret: env.AUTH_SECRET, workspaceId: c.workspaceId, userId }),
  });
}

import { type InferSelectModel, sql } from "drizzle-orm";
import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";

const id = () =>
  text("id")
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID());
const createdAt = () =>
  integer("created_at", { mode: "timestamp_ms" })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`);

export const ROLES = ["viewer", "contributor", "curator", "admin"] as const;
export const MODEL_KINDS = ["markov", "eca", "ca", "supercell", "decimated-chain", "iterate"] as const;
export const MAP_KINDS = ["decimation", "lumping", "iterate", "blocking", "projection", "coarse-graining", "exact-lumping"] as const;
export const MAP_STATUSES = ["certified", "retracted"] as const;
export const DERIVATIONS = ["reflect", "complement", "reflect-complement"] as const;
export const JOB_STATUSES = ["queued", "running", "succeeded", "failed", "cancelled"] as const;
export const JOB_LANES = ["small", "large"] as const;
export const OUTBOX_STATUSES = ["pending", "sent", "failed"] as const;
export const MAIL_DELIVERIES = ["immediate", "digest", "off"] as const;
export const WATCH_SCOPES = ["class", "onto", "lumping-of"] as const;
export const ANNOTATION_KINDS = ["note", "tag", "published"] as const;

export const users = sqliteTable("users", {
  id: id(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  passwordHash: text("password_hash"),
  emailVerifiedAt: integer("email_verified_at", { mode: "timestamp_ms" }),
  createdAt: createdAt(),
});
export type User = InferSelectModel<typeof users>;

/** One-time e-mail sign-in links; only the SHA-256 of the token is stored. */
export const signInTokens = sqliteTable("sign_in_tokens", {
  tokenHash: text("token_hash").primaryKey(),
  email: text("email").notNull(),
  expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
  usedAt: integer("used_at", { mode: "timestamp_ms" }),
  createdAt: createdAt(),
});
export type SignInToken = InferSelectModel<typeof signInTokens>;

/** A team's shared atlas. */
export const workspaces = sqliteTable("workspaces", {
  id: id(),
  slug: text("slug").notNull().unique(),
  name: text("name").notNull(),
  /** Whether anyone, signed in or not, may read the atlas at /public/<slug> (no members, addresses or tokens). */
  publicView: integer("public_view", { mode: "boolean" }).notNull().default(false),
  createdAt: createdAt(),
});
export type Workspace = InferSelectModel<typeof workspaces>;

export const memberships = sqliteTable(
  "memberships",
  {
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: text("role", { enum: ROLES }).notNull(),
    /** How watch mail reaches this member: each event at once, one daily digest, or none (unsubscribed). */
    mailDelivery: text("mail_delivery", { enum: MAIL_DELIVERIES }).notNull().default("immediate"),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.workspaceId, t.userId] }), index("memberships_user_idx").on(t.userId)],
);
export type Membership = InferSelectModel<typeof memberships>;

/**
 * A model (node). `address` is the content address of its canonical form, so a second submission
 * of the same model in a workspace is the same row. Summary columns exist for search and filters.
 */
export const models = sqliteTable(
  "models",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    address: text("address").notNull(),
    kind: text("kind", { enum: MODEL_KINDS }).notNull(),
    name: text("name").notNull(),
    description: text("description").notNull().default(""),
    /** Canonical JSON of the model (the core's canonical form). */
    canonical: text("canonical").notNull(),
    rule: integer("rule"),
    alphabet: integer("alphabet"),
    radius: integer("radius"),
    states: integer("states"),
    block: integer("block"),
    steps: integer("steps"),
    symmetryClass: integer("symmetry_class"),
    baseModelId: text("base_model_id"),
    /** JSON array of strings. */
    tags: text("tags").notNull().default("[]"),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("models_workspace_address_uq").on(t.workspaceId, t.address),
    index("models_workspace_kind_idx").on(t.workspaceId, t.kind),
    index("models_workspace_rule_idx").on(t.workspaceId, t.rule),
    // Model lists and searches page by (name, id): walked in order instead of sorting the workspace.
    index("models_workspace_name_idx").on(t.workspaceId, t.name, t.id),
    // A name search first asks whether any description holds the term: only the described models, not a scan of all.
    index("models_workspace_described_idx").on(t.workspaceId).where(sql`${t.description} != ''`),
    // models_workspace_order_idx, in modelOrder's own expressions, is made by drizzle/0007_read-versions-triggers.sql:
    // drizzle-kit splits an expression index at its commas.
  ],
);
export type Model = InferSelectModel<typeof models>;

/** Certificates by content address (`sha256:<hex>` of the RFC 8785 form). Global and immutable. */
export const certificates = sqliteTable("certificates", {
  address: text("address").primaryKey(),
  kind: text("kind").notNull(),
  formatVersion: integer("format_version").notNull(),
  body: text("body").notNull(),
  checkerVersion: text("checker_version").notNull(),
  verifiedAt: integer("verified_at", { mode: "timestamp_ms" }).notNull(),
  createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
  createdAt: createdAt(),
});
export type Certificate = InferSelectModel<typeof certificates>;

/** Maps (edges). Never deleted: a curator retracts with a reason. */
export const maps = sqliteTable(
  "maps",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    sourceModelId: text("source_model_id")
      .notNull()
      .references(() => models.id),
    targetModelId: text("target_model_id")
      .notNull()
      .references(() => models.id),
    kind: text("kind", { enum: MAP_KINDS }).notNull(),
    block: integer("block"),
    steps: integer("steps"),
    summary: text("summary").notNull(),
    certificateAddress: text("certificate_address")
      .notNull()
      .references(() => certificates.address),
    authorId: text("author_id").references(() => users.id, { onDelete: "set null" }),
    status: text("status", { enum: MAP_STATUSES }).notNull().default("certified"),
    retractedReason: text("retracted_reason"),
    retractedBy: text("retracted_by").references(() => users.id, { onDelete: "set null" }),
    retractedAt: integer("retracted_at", { mode: "timestamp_ms" }),
    derivedFromMapId: text("derived_from_map_id"),
    derivation: text("derivation", { enum: DERIVATIONS }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("maps_workspace_certificate_uq").on(t.workspaceId, t.certificateAddress),
    index("maps_source_idx").on(t.workspaceId, t.sourceModelId),
    index("maps_target_idx").on(t.workspaceId, t.targetModelId),
    index("maps_kind_idx").on(t.workspaceId, t.kind),
  ],
);
export type AtlasMap = InferSelectModel<typeof maps>;

/** A chain of maps (a proof) with its composite certificate. */
export const chains = sqliteTable(
  "chains",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    compositeCertificateAddress: text("composite_certificate_address")
      .notNull()
      .references(() => certificates.address),
    /** "links" (each link verified and matched) or "links+composite" (also checked directly). */
    verification: text("verification", { enum: ["links", "links+composite"] }).notNull(),
    authorId: text("author_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("chains_workspace_composite_uq").on(t.workspaceId, t.compositeCertificateAddress)],
);
export type Chain = InferSelectModel<typeof chains>;

export const chainLinks = sqliteTable(
  "chain_links",
  {
    chainId: text("chain_id")
      .notNull()
      .references(() => chains.id, { onDelete: "cascade" }),
    position: integer("position").notNull(),
    mapId: text("map_id")
      .notNull()
      .references(() => maps.id),
  },
  (t) => [primaryKey({ columns: [t.chainId, t.position] })],
);
export type ChainLink = InferSelectModel<typeof chainLinks>;

/** A finished search, stored so that negative results ("none up to block N") can be cited. */
export const searchRecords = sqliteTable(
  "search_records",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    modelId: text("model_id")
      .notNull()
      .references(() => models.id),
    kind: text("kind").notNull(),
    maxBlock: integer("max_block"),
    algorithm: text("algorithm").notNull(),
    algorithmVersion: text("algorithm_version").notNull(),
    /** JSON: what the search covered (rule, block sizes, kind of projection, bounds). */
    coverage: text("coverage").notNull(),
    /** JSON: what it found (counts, targets), possibly empty. */
    outcome: text("outcome").notNull(),
    found: integer("found").notNull(),
    jobId: text("job_id"),
    createdBy: text("created_by").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("search_records_model_idx").on(t.workspaceId, t.modelId)],
);
export type SearchRecord = InferSelectModel<typeof searchRecords>;

export const watches = sqliteTable(
  "watches",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    modelId: text("model_id")
      .notNull()
      .references(() => models.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("watches_user_model_uq").on(t.userId, t.modelId), index("watches_model_idx").on(t.modelId)],
);
export type Watch = InferSelectModel<typeof watches>;

/** Mail to send, written in the same transaction as the event that caused it. */
export const notificationOutbox = sqliteTable(
  "notification_outbox",
  {
    id: id(),
    workspaceId: text("workspace_id").references(() => workspaces.id, { onDelete: "cascade" }),
    userId: text("user_id").references(() => users.id, { onDelete: "cascade" }),
    toAddress: text("to_address").notNull(),
    subject: text("subject").notNull(),
    body: text("body").notNull(),
    mapId: text("map_id"),
    status: text("status", { enum: OUTBOX_STATUSES }).notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    lastError: text("last_error"),
    sentAt: integer("sent_at", { mode: "timestamp_ms" }),
    /** Not tried again before this time (back-off); null means at once. */
    nextAttemptAt: integer("next_attempt_at", { mode: "timestamp_ms" }),
    /** The process that claimed the row for delivery, and until when; another process waits for the lease to end. */
    leaseOwner: text("lease_owner"),
    leaseExpiresAt: integer("lease_expires_at", { mode: "timestamp_ms" }),
    /** One-click unsubscribe address for the List-Unsubscribe header (RFC 2369, RFC 8058); null for mail that is not watch mail. */
    unsubscribeUrl: text("unsubscribe_url"),
    createdAt: createdAt(),
  },
  (t) => [index("outbox_status_idx").on(t.status)],
);
export type OutboxMessage = InferSelectModel<typeof notificationOutbox>;

export const jobs = sqliteTable(
  "jobs",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    ownerId: text("owner_id").references(() => users.id, { onDelete: "set null" }),
    kind: text("kind").notNull(),
    /** JSON parameters, validated by the job kind's zod schema. */
    params: text("params").notNull(),
    status: text("status", { enum: JOB_STATUSES }).notNull().default("queued"),
    progress: real("progress").notNull().default(0),
    currentItem: text("current_item"),
    result: text("result"),
    error: text("error"),
    attempts: integer("attempts").notNull().default(0),
    cancelRequested: integer("cancel_requested", { mode: "boolean" }).notNull().default(false),
    createdAt: createdAt(),
    startedAt: integer("started_at", { mode: "timestamp_ms" }),
    finishedAt: integer("finished_at", { mode: "timestamp_ms" }),
    /** The runner that holds the job while it runs (process-unique), and until when (renewed by its heartbeat). */
    leaseOwner: text("lease_owner"),
    leaseExpiresAt: integer("lease_expires_at", { mode: "timestamp_ms" }),
    /** Small jobs have workers that large ones may not take (fair sharing, see server/jobs/fairness.ts). */
    lane: text("lane", { enum: JOB_LANES }).notNull().default("large"),
  },
  (t) => [index("jobs_status_idx").on(t.status), index("jobs_owner_idx").on(t.ownerId, t.status)],
);
export type Job = InferSelectModel<typeof jobs>;

/** Personal API tokens: stored as SHA-256, scoped to one workspace and a role no higher than the owner's. */
export const apiTokens = sqliteTable(
  "api_tokens",
  {
    id: id(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    /** The first characters of the token, shown so that a person can tell tokens apart. */
    prefix: text("prefix").notNull(),
    role: text("role", { enum: ROLES }).notNull(),
    lastUsedAt: integer("last_used_at", { mode: "timestamp_ms" }),
    revokedAt: integer("revoked_at", { mode: "timestamp_ms" }),
    createdAt: createdAt(),
  },
  (t) => [index("api_tokens_user_idx").on(t.userId)],
);
export type ApiToken = InferSelectModel<typeof apiTokens>;

export const auditEvents = sqliteTable(
  "audit_events",
  {
    id: id(),
    workspaceId: text("workspace_id").references(() => workspaces.id, { onDelete: "cascade" }),
    actorId: text("actor_id").references(() => users.id, { onDelete: "set null" }),
    action: text("action").notNull(),
    subjectType: text("subject_type").notNull(),
    subjectId: text("subject_id").notNull(),
    /** JSON detail. */
    detail: text("detail").notNull().default("{}"),
    createdAt: createdAt(),
  },
  (t) => [index("audit_workspace_idx").on(t.workspaceId, t.createdAt)],
);
export type AuditEvent = InferSelectModel<typeof auditEvents>;

/**
 * Fixed-window counters of sign-in attempts and sign-in-link requests, keyed by what is limited
 * ("sign-in:account:<e-mail>", "link:address:<ip>"). In the database so that every app process
 * sharing it counts against the same limit.
 */
export const rateLimits = sqliteTable("rate_limits", {
  key: text("key").primaryKey(),
  count: integer("count").notNull().default(0),
  windowStart: integer("window_start", { mode: "timestamp_ms" }).notNull(),
});
export type RateLimit = InferSelectModel<typeof rateLimits>;
/** An invitation to a workspace: the link's token is mailed, only its SHA-256 is stored. */
export const invitations = sqliteTable(
  "invitations",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    role: text("role", { enum: ROLES }).notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    invitedBy: text("invited_by").references(() => users.id, { onDelete: "set null" }),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    acceptedAt: integer("accepted_at", { mode: "timestamp_ms" }),
    acceptedBy: text("accepted_by").references(() => users.id, { onDelete: "set null" }),
    revokedAt: integer("revoked_at", { mode: "timestamp_ms" }),
    createdAt: createdAt(),
  },
  (t) => [index("invitations_workspace_idx").on(t.workspaceId)],
);
export type Invitation = InferSelectModel<typeof invitations>;

/**
 * Watching more than one model: a whole class ("every ECA": scope class, modelKind eca), or a saved
 * search ("anything that coarse-grains onto ECA 128": scope onto; "any lumping of this chain": scope lumping-of).
 */
export const watchRules = sqliteTable(
  "watch_rules",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    scope: text("scope", { enum: WATCH_SCOPES }).notNull(),
    modelKind: text("model_kind", { enum: MODEL_KINDS }),
    modelId: text("model_id").references(() => models.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("watch_rules_uq").on(t.userId, t.workspaceId, t.scope, t.modelKind, t.modelId),
    index("watch_rules_workspace_idx").on(t.workspaceId),
  ],
);
export type WatchRule = InferSelectModel<typeof watchRules>;

/** The in-app notification list: one row per watcher and certified map. */
export const notifications = sqliteTable(
  "notifications",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    mapId: text("map_id"),
    title: text("title").notNull(),
    body: text("body").notNull(),
    link: text("link").notNull(),
    readAt: integer("read_at", { mode: "timestamp_ms" }),
    /** Set when a daily digest included it (digest watchers only). */
    digestedAt: integer("digested_at", { mode: "timestamp_ms" }),
    createdAt: createdAt(),
  },
  (t) => [index("notifications_user_idx").on(t.userId, t.workspaceId, t.readAt)],
);
export type Notification = InferSelectModel<typeof notifications>;

/** Curators' and contributors' notes, tags and "published in" references on models and maps. */
export const annotations = sqliteTable(
  "annotations",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    subjectType: text("subject_type", { enum: ["model", "map"] }).notNull(),
    subjectId: text("subject_id").notNull(),
    kind: text("kind", { enum: ANNOTATION_KINDS }).notNull(),
    text: text("text").notNull(),
    authorId: text("author_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("annotations_subject_idx").on(t.workspaceId, t.subjectType, t.subjectId)],
);
export type Annotation = InferSelectModel<typeof annotations>;

/** A workbench canvas saved per person (issue 11): private unless shared read-only with the workspace. */
export const drafts = sqliteTable(
  "drafts",
  {
    id: id(),
    workspaceId: text("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    ownerId: text("owner_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    /** JSON of the canvas: nodes, edges, chain (components/workbench/workbenchState). */
    body: text("body").notNull().default("{}"),
    shared: integer("shared", { mode: "boolean" }).notNull().default(false),
    createdAt: createdAt(),
    updatedAt: integer("updated_at", { mode: "timestamp_ms" })
      .notNull()
      .default(sql`(unixepoch('subsec') * 1000)`),
  },
  (t) => [index("drafts_workspace_owner_idx").on(t.workspaceId, t.ownerId, t.updatedAt)],
);
export type Draft = InferSelectModel<typeof drafts>;

/**
 * Version counters that the in-process read caches check (server/read-cache): `user:<id>` moves when
 * a person's row, memberships or tokens change, `ws:<id>` when a workspace's row changes, and
 * `atlas:<id>` when its models, maps or chains change. Database triggers (drizzle/0007_read-versions-triggers.sql)
 * bump them inside the writing transaction, so every process sees a write at its next read.
 */
export const readVersions = sqliteTable("read_versions", {
  scope: text("scope").primaryKey(),
  version: integer("version").notNull().default(0),
});
export type ReadVersion = InferSelectModel<typeof readVersions>;

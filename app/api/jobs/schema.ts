import { z } from "zod";
import { JOB_STATUSES } from "@/db/schema";
import { Cursor, IdParams } from "@/app/api/_lib/schemas";
import { errorResponses, jsonBody, type RouteConfig } from "@/app/api/_lib/doc";
import { EcaAtlasParams } from "@/server/jobs/kinds/eca-atlas.compute";
import { LumpChainParams } from "@/server/jobs/kinds/lump-chain.compute";
import { LumpLargeChainParams } from "@/server/jobs/kinds/lump-large-chain.compute";
import { SearchProjectionParams } from "@/server/jobs/kinds/search-projection.compute";
import { TotalisticAtlasParams } from "@/server/jobs/kinds/totalistic-atlas.compute";
import { VerifyChainParams } from "@/server/jobs/kinds/verify-chain.compute";

const SECURITY: RouteConfig["security"] = [{ bearer: [] }, { session: [] }];

/** What the handler parses; the kind's own schema then checks `params` (400 naming `params.<field>`). */
export const CreateJobBody = z.object({
  kind: z.string().min(1).max(60),
  params: z.record(z.string(), z.unknown()).default({}),
});

/** The same body as documented: one shape per job kind. */
export const CreateJobDoc = z
  .discriminatedUnion("kind", [
    z.object({ kind: z.literal("eca-atlas"), params: EcaAtlasParams }).meta({ description: "All 256 ECAs over a range of block sizes." }),
    z.object({ kind: z.literal("search-projection"), params: SearchProjectionParams }).meta({ description: "One ECA, further than the atlas goes." }),
    z.object({ kind: z.literal("lump-chain"), params: LumpChainParams }).meta({ description: "The coarsest lumping of a chain refining an observable." }),
    z.object({ kind: z.literal("verify-chain"), params: VerifyChainParams }).meta({ description: "A chain of certificates checked as one composite." }),
    z.object({ kind: z.literal("totalistic-atlas"), params: TotalisticAtlasParams }).meta({ description: "Proper congruences of the three-state totalistic rules at block 1 and 2." }),
    z.object({ kind: z.literal("lump-large-chain"), params: LumpLargeChainParams }).meta({ description: "The coarsest exact lumping of a generated chain of up to two million states." }),
  ])
  .meta({ id: "CreateJob" });

export const ListJobsQuery = z.object({
  mine: z
    .enum(["1", "0", "true", "false"])
    .optional()
    .transform((v) => v === "1" || v === "true")
    .meta({ description: "Only my jobs." }),
  status: z.enum(JOB_STATUSES).optional(),
  cursor: Cursor,
  limit: z.coerce.number().int().min(1).max(100).default(20),
});

export const JobParams = IdParams;

export const JobOut = z
  .object({
    id: z.string(),
    workspaceId: z.string(),
    ownerId: z.string().nullable(),
    kind: z.string(),
    params: z.unknown(),
    status: z.enum(JOB_STATUSES),
    progress: z.number().min(0).max(1),
    currentItem: z.string().nullable(),
    result: z.unknown().meta({ description: "What the job found (kind-specific); partial for a cancelled job." }),
    error: z.string().nullable().meta({ description: "Why it failed or stopped." }),
    attempts: z.number().int(),
    cancelRequested: z.boolean(),
    createdAt: z.string(),
    startedAt: z.string().nullable(),
    finishedAt: z.string().nullable(),
  })
  .meta({ id: "Job" });

export const JobListOut = z.object({ items: z.array(JobOut), nextCursor: z.string().nullable() });

/** The jobs endpoints for the OpenAPI document. */
export const jobRoutes: RouteConfig[] = [
  {
    method: "post",
    path: "/api/jobs",
    summary: "Start a job (contributor or above); at most JOBS_PER_USER queued or running per person",
    tags: ["jobs"],
    security: SECURITY,
    request: { body: jsonBody(CreateJobDoc, "The kind and its parameters") },
    responses: { 201: jsonBody(JobOut, "The queued job"), ...errorResponses("bad_input", "unauthenticated", "forbidden", "too_many_jobs") },
  },
  {
    method: "get",
    path: "/api/jobs",
    summary: "The workspace's jobs, newest first",
    tags: ["jobs"],
    security: SECURITY,
    request: { query: ListJobsQuery },
    responses: { 200: jsonBody(JobListOut, "A page of jobs"), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
  {
    method: "get",
    path: "/api/jobs/{id}",
    summary: "One job with its progress and result",
    tags: ["jobs"],
    security: SECURITY,
    request: { params: JobParams },
    responses: { 200: jsonBody(JobOut, "The job"), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
  {
    method: "post",
    path: "/api/jobs/{id}/cancel",
    summary: "Cancel a job (its owner or an admin); a running job stops at its next check",
    tags: ["jobs"],
    security: SECURITY,
    request: { params: JobParams },
    responses: { 200: jsonBody(JobOut, "The job after the request"), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
];

import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../_lib/doc";
import { Cursor, IdParams, Limit, MapOut, pageOf } from "../_lib/schemas";

export const ListQuery = z.object({ limit: Limit, cursor: Cursor });

export const CreateBody = z
  .object({
    name: z.string().trim().min(1, "Give the chain a name.").max(200),
    mapIds: z.array(z.string().min(1).max(100)).min(1, "Add at least one certified map.").max(32, "A chain has at most 32 links."),
  })
  .meta({ id: "CreateChainRequest" });

export const ChainOut = z
  .object({
    id: z.string(),
    name: z.string(),
    compositeCertificateAddress: z.string(),
    verification: z.enum(["links", "links+composite"]).meta({
      description: "`links`: every link verified and matched; `links+composite`: the composite was also checked directly.",
    }),
    authorId: z.string().nullable(),
    createdAt: z.string(),
    links: z.array(MapOut).optional(),
  })
  .meta({ id: "Chain" });

export const CreatedChain = z
  .object({
    status: z.enum(["created", "existing"]),
    chainId: z.string(),
    address: z.string(),
    verification: z.enum(["links", "links+composite"]),
  })
  .meta({ id: "StoredChain" });

export const Params = IdParams;

export const routes: RouteConfig[] = [
  {
    method: "get",
    path: "/api/chains",
    summary: "Chains (proofs) of the current workspace, newest first",
    tags: ["chains"],
    security: SECURITY,
    request: { query: ListQuery },
    responses: { 200: jsonBody(pageOf(ChainOut), "One page of chains."), ...errorResponses("bad_input", "unauthenticated", "forbidden") },
  },
  {
    method: "post",
    path: "/api/chains",
    summary: "Compose certified maps into a chain; the server verifies the links and the composite",
    tags: ["chains"],
    security: SECURITY,
    request: { body: jsonBody(CreateBody, "The maps, in order.") },
    responses: {
      201: jsonBody(CreatedChain, "Verified and stored."),
      200: jsonBody(CreatedChain, "The same composite was stored before."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found", "conflict", "too_large", "does_not_commute"),
    },
  },
  {
    method: "get",
    path: "/api/chains/{id}",
    summary: "One chain with its links",
    tags: ["chains"],
    security: SECURITY,
    request: { params: Params },
    responses: { 200: jsonBody(ChainOut, "The chain."), ...errorResponses("unauthenticated", "forbidden", "not_found") },
  },
];

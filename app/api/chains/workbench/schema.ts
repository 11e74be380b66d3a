import { z } from "zod";
import { errorResponses, jsonBody, SECURITY, type RouteConfig } from "../../_lib/doc";

const Key = z.string().min(1).max(100);
const Count = z.number().int().min(1).max(1_000_000);

const Spec = z
  .discriminatedUnion("kind", [
    z.object({ kind: z.literal("projection"), block: Count, projection: z.array(z.number().int().min(0).max(255)).min(1).max(65_536) }),
    z.object({ kind: z.literal("lumping"), partition: z.array(z.number().int().min(0)).min(1).max(100_000) }),
    z.object({ kind: z.literal("decimation"), steps: Count }),
    z.object({ kind: z.literal("iterate"), steps: Count }),
    z.object({ kind: z.literal("blocking"), block: Count }),
  ])
  .meta({ id: "WorkbenchMapSpec", description: "The map's parameters; its source model is the map's source node." });

const Node = z
  .object({
    key: Key.meta({ description: "The node's key on the canvas; maps refer to it." }),
    modelId: z.string().min(1).max(200).optional().meta({ description: "A model already in the atlas." }),
    model: z.looseObject({ kind: z.string() }).optional().meta({ description: "A new model (as POST /api/models takes it)." }),
    name: z.string().trim().max(200).optional(),
    description: z.string().trim().max(2000).optional(),
  })
  .refine((n) => !(n.modelId && n.model), { message: "Send a model or a modelId, not both.", path: ["model"] });

const Link = z.union([z.object({ map: Key }), z.object({ mapId: z.string().min(1).max(200) })]);

export const WorkbenchBody = z
  .object({
    models: z.array(Node).max(64, "At most 64 nodes per request.").meta({
      description: "The nodes: a model in the atlas, a new model, or neither (a model the map into it determines).",
    }),
    maps: z.array(z.object({ key: Key, source: Key, target: Key, spec: Spec })).max(32, "At most 32 maps per request."),
    chain: z
      .object({
        name: z.string().trim().min(1, "Give the chain a name.").max(200),
        links: z.array(Link).min(2, "A chain has at least two links.").max(32, "A chain has at most 32 links."),
      })
      .nullish()
      .meta({ description: "The maps, in order, to store as a chain: keys of maps in this request or ids of maps in the atlas." }),
  })
  .superRefine((body, ctx) => {
    const nodes = new Set(body.models.map((m) => m.key));
    const maps = new Set(body.maps.map((m) => m.key));
    const into = new Set<string>();
    body.models.forEach((m, i) => {
      if (body.models.findIndex((o) => o.key === m.key) !== i) ctx.addIssue({ code: "custom", message: `The key ${m.key} names two nodes.`, path: ["models", i, "key"] });
    });
    body.maps.forEach((m, i) => {
      for (const end of ["source", "target"] as const) {
        if (!nodes.has(m[end])) ctx.addIssue({ code: "custom", message: `No node ${m[end]} in models.`, path: ["maps", i, end] });
      }
      if (m.source === m.target) ctx.addIssue({ code: "custom", message: "A map needs two different nodes.", path: ["maps", i, "target"] });
      if (into.has(m.target)) ctx.addIssue({ code: "custom", message: "That node already has a map into it; its model is determined by that map.", path: ["maps", i, "target"] });
      into.add(m.target);
    });
    body.chain?.links.forEach((l, i) => {
      if ("map" in l && !maps.has(l.map)) ctx.addIssue({ code: "custom", message: `No map ${l.map} in maps.`, path: ["chain", "links", i, "map"] });
    });
  })
  .meta({ id: "CertifyWorkbenchRequest" });

const MapResult = z
  .object({
    key: z.string(),
    status: z.enum(["certified", "refused", "too-large", "skipped"]),
    created: z.boolean().optional(),
    mapId: z.string().optional(),
    address: z.string().optional(),
    message: z.string().optional(),
    field: z.string().optional(),
    counterexample: z.unknown().optional().meta({ description: "For a refused square: what the 422 of POST /api/certificates carries." }),
    bound: z.string().optional(),
    limit: z.number().optional(),
    asked: z.number().optional(),
    build: z.unknown().optional().meta({ description: "For a map too large for a request: the claim, to check as a `verify-map` job." }),
  })
  .meta({ id: "WorkbenchMapResult" });

export const WorkbenchOut = z
  .object({
    models: z.array(z.object({ key: z.string(), id: z.string(), name: z.string(), model: z.unknown() })),
    maps: z.array(MapResult),
    chain: z
      .object({
        status: z.enum(["created", "existing", "too-large", "refused", "not-stored"]),
        chainId: z.string().optional(),
        address: z.string().optional(),
        verification: z.enum(["links", "links+composite"]).optional(),
        message: z.string().optional(),
        link: z.number().nullable().optional(),
        counterexample: z.unknown().optional().meta({ description: "For a refused chain: the checker's counterexample at the failing link or composite." }),
      })
      .nullable(),
  })
  .meta({ id: "CertifyWorkbenchResult" });

export const routes: RouteConfig[] = [
  {
    method: "post",
    path: "/api/chains/workbench",
    summary: "Certify a workbench in one request: new models, proposed maps and the chain",
    description:
      "Checks each new model and each map (built from its source node and its parameters) in the verifier, in the order the maps determine their targets, composes and re-verifies the chain, then writes everything that holds in one transaction. Each map comes back certified, refused (with its counterexample), too-large (with its claim, for a `verify-map` job) or skipped; the chain is stored only when every link holds.",
    tags: ["chains"],
    security: SECURITY,
    request: { body: jsonBody(WorkbenchBody, "The canvas: nodes, maps, and the chain.") },
    responses: {
      200: jsonBody(WorkbenchOut, "What was certified and stored, map by map."),
      ...errorResponses("bad_input", "unauthenticated", "forbidden", "not_found", "too_large", "too_many_requests"),
    },
  },
];

import "server-only";
import type { Model } from "@/db/schema";
import { getModel } from "./models";
import { searchAtlas } from "./search";

export type ModelLookup = { status: "found"; model: Model } | { status: "none" } | { status: "ambiguous"; choices: Model[] };

const ID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const RULE = /^(?:eca|rule)?\s*(\d{1,3})$/i;

/**
 * A model named the way a person types it: its id, its `sha256:` address, a rule number ("146",
 * "ECA 146", "rule 146" — the ECA), or its name (exact, ignoring case, else the only partial match).
 */
export async function findModelByText({ workspaceId, text }: { workspaceId: string; text: string }): Promise<ModelLookup> {
  const wanted = text.trim();
  if (!wanted) return { status: "none" };
  if (wanted.startsWith("sha256:") || ID.test(wanted)) {
    const model = await getModel({ workspaceId, idOrAddress: wanted });
    return model ? { status: "found", model } : { status: "none" };
  }
  const rule = RULE.exec(wanted);
  if (rule && Number(rule[1]) <= 255) {
    const result = await searchAtlas({ workspaceId, target: "models", rule: Number(rule[1]), modelKind: "eca", limit: 1 });
    const model = result.items[0] as Model | undefined;
    return model ? { status: "found", model } : { status: "none" };
  }
  const result = await searchAtlas({ workspaceId, target: "models", q: wanted, limit: 8 });
  const items = result.items as Model[];
  // Names are chosen by people and need not be unique: two exact matches are a choice, never a silent pick.
  const exact = items.filter((m) => m.name.toLowerCase() === wanted.toLowerCase());
  if (exact.length === 1) return { status: "found", model: exact[0] };
  if (exact.length > 1) return { status: "ambiguous", choices: exact };
  if (items.length === 1) return { status: "found", model: items[0] };
  return items.length === 0 ? { status: "none" } : { status: "ambiguous", choices: items };
}

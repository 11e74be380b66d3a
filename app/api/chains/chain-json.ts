import type { Chain } from "@/db/schema";
import type { ChainView } from "@/db/queries/atlas";
import { mapJson } from "../_lib/schemas";

export function chainJson(chain: Chain | ChainView) {
  return {
    id: chain.id,
    name: chain.name,
    compositeCertificateAddress: chain.compositeCertificateAddress,
    verification: chain.verification,
    authorId: chain.authorId,
    createdAt: chain.createdAt.toISOString(),
    ...("links" in chain ? { links: chain.links.map(mapJson) } : {}),
  };
}

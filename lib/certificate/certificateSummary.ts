import { describeModel, type Model } from "@/lib/models";
import type { Certificate, MapKind } from "./schema";

export type CertificateSummary = { kind: MapKind; source: Model; target: Model; block?: number; steps?: number; text: string };

/** What a certificate claims, in one line: "ECA 105 → ECA 150: projection at block 2, 2 steps". */
export function certificateSummary(cert: Certificate): CertificateSummary {
  const { map, source, target } = cert;
  const arrow = `${describeModel(source)} → ${describeModel(target)}`;
  switch (map.kind) {
    case "projection":
      return { kind: map.kind, source, target, block: map.block, steps: map.steps, text: `${arrow}: projection at block ${map.block}, ${map.steps} steps` };
    case "blocking":
      return { kind: map.kind, source, target, block: map.block, steps: map.steps, text: `${arrow}: supercell blocking at block ${map.block}, ${map.steps} steps` };
    case "lumping": {
      const blocks = Math.max(...map.partition) + 1;
      const of = map.steps > 1 ? ` of the ${map.steps}-step chain` : "";
      return { kind: map.kind, source, target, steps: map.steps, text: `${arrow}: lumping into ${blocks} blocks${of}` };
    }
    case "exact-lumping": {
      const of = map.steps > 1 ? ` of the ${map.steps}-step chain` : "";
      return { kind: map.kind, source, target, steps: map.steps, text: `${arrow}: exact lumping into ${Math.max(...map.partition) + 1} blocks${of}` };
    }
    case "decimation":
      return { kind: map.kind, source, target, steps: map.steps, text: `${arrow}: ${map.steps}-step decimation` };
    case "iterate":
      return { kind: map.kind, source, target, steps: map.steps, text: `${arrow}: ${map.steps}-step iterate` };
  }
}

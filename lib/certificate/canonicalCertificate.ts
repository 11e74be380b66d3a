import { canonicalModel, joinPath, ModelInputError, type Issue } from "@/lib/models";
import { canonicalPartition } from "@/lib/markov";
import { CertificateSchema, type Certificate, type CertificateMap } from "./schema";

/** Schema or model problems, each with the JSON path where it was found. */
export class CertificateInputError extends Error {
  constructor(readonly issues: Issue[]) {
    super(issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join("; "));
    this.name = "CertificateInputError";
  }
}

/** Parses and canonicalises a certificate (both models, map defaults, partition numbering); keeps `address` as given. */
export function canonicalCertificate(input: unknown): Certificate {
  const parsed = CertificateSchema.safeParse(input);
  if (!parsed.success) throw new CertificateInputError(parsed.error.issues.map((i) => ({ path: joinPath(i.path), message: i.message })));
  const issues: Issue[] = [];
  const model = (field: "source" | "target") => {
    try {
      return canonicalModel(parsed.data[field]);
    } catch (e) {
      if (!(e instanceof ModelInputError)) throw e;
      issues.push(...e.issues.map((i) => ({ path: i.path ? `${field}.${i.path}` : field, message: i.message })));
      return { kind: "eca", rule: 0 } as const;
    }
  };
  const source = model("source");
  const target = model("target");
  if (issues.length > 0) throw new CertificateInputError(issues);
  const cert: Certificate = { format: parsed.data.format, version: parsed.data.version, map: canonicalMap(parsed.data.map), source, target };
  if (parsed.data.address !== undefined) cert.address = parsed.data.address;
  return cert;
}

function canonicalMap(map: (typeof CertificateSchema)["_output"]["map"]): CertificateMap {
  switch (map.kind) {
    case "projection":
      return { kind: "projection", block: map.block, steps: map.steps ?? map.block, projection: [...map.projection] };
    case "lumping":
      return { kind: "lumping", partition: canonicalPartition(map.partition), steps: map.steps ?? 1 };
    case "exact-lumping":
      return { kind: "exact-lumping", partition: canonicalPartition(map.partition), steps: map.steps ?? 1 };
    case "decimation":
      return { kind: "decimation", steps: map.steps };
    case "blocking":
      return { kind: "blocking", block: map.block, steps: map.steps ?? map.block };
    case "iterate":
      return { kind: "iterate", steps: map.steps };
  }
}

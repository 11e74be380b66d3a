import type { Model } from "./schema";

/** A short human name: "ECA 146", "Markov chain (3 states)", "rule 105, block 2 supercell". */
export function describeModel(model: Model): string {
  switch (model.kind) {
    case "eca":
      return `ECA ${model.rule}`;
    case "ca":
      return `CA k=${model.k}, r=${model.r}`;
    case "markov":
      return `Markov chain (${model.matrix.length} state${model.matrix.length === 1 ? "" : "s"})`;
    case "supercell": {
      const steps = model.steps === model.block ? "" : `, ${model.steps} steps`;
      return `${baseName(model.base)}, block ${model.block} supercell${steps}`;
    }
    case "iterate":
      return `${baseName(model.base)}, ${model.steps}-step iterate`;
    case "decimated":
      return `${describeModel(model.base)}, ${model.steps}-step decimation`;
  }
}

function baseName(base: Model): string {
  return base.kind === "eca" ? `rule ${base.rule}` : describeModel(base);
}

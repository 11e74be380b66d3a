import type { ModelFields, ModelKind } from "@/db/queries/models";
import { chainSize, describeModel, modelAddress, type Model } from "@/lib/models";

const KIND: Record<Model["kind"], ModelKind> = {
  markov: "markov",
  eca: "eca",
  ca: "ca",
  supercell: "supercell",
  iterate: "iterate",
  decimated: "decimated-chain",
};

/**
 * The stored columns of a canonical model: its content address, name and the summary numbers that
 * search and filters use. Derived models carry their base, which is stored as a node of its own.
 * Pure (runs inside the verification worker too); `symmetryClassOf` names the ECA's class.
 */
export function modelFields(model: Model, symmetryClassOf: (rule: number) => number | null = () => null): ModelFields {
  const common = {
    address: modelAddress(model),
    kind: KIND[model.kind],
    name: describeModel(model),
    canonical: JSON.stringify(model),
  };
  switch (model.kind) {
    case "eca":
      return { ...common, rule: model.rule, alphabet: 2, radius: 1, symmetryClass: symmetryClassOf(model.rule) };
    case "ca":
      return { ...common, alphabet: model.k, radius: model.r };
    case "markov":
      return { ...common, states: chainSize(model) };
    case "supercell":
      return { ...common, block: model.block, steps: model.steps, rule: ruleOf(model.base), base: modelFields(model.base, symmetryClassOf) };
    case "iterate":
      return { ...common, steps: model.steps, rule: ruleOf(model.base), base: modelFields(model.base, symmetryClassOf) };
    case "decimated":
      return { ...common, steps: model.steps, states: chainSize(model), base: modelFields(model.base, symmetryClassOf) };
  }
}

function ruleOf(base: Model): number | null {
  return base.kind === "eca" ? base.rule : null;
}

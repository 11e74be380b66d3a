import { ecaTable, iterateTable, supercellRadius, supercellTable, type RuleTable } from "@/lib/ca";
import { matrixPower, type Matrix } from "@/lib/markov";
import { parseRational } from "@/lib/rational";
import type { Model } from "./schema";

/** Alphabet and radius of a CA-like model, computed without building its table. */
export function caShape(model: Model): { k: number; r: number } {
  switch (model.kind) {
    case "eca":
      return { k: 2, r: 1 };
    case "ca":
      return { k: model.k, r: model.r };
    case "iterate": {
      const b = caShape(model.base);
      return { k: b.k, r: b.r * model.steps };
    }
    case "supercell": {
      const b = caShape(model.base);
      return { k: b.k ** model.block, r: supercellRadius(b.r, model.block, model.steps) };
    }
    default:
      throw new TypeError(`${model.kind} is not a cellular automaton`);
  }
}

/** The rule table of a CA-like model (derived models are computed; callers check limits first). */
export function modelRuleTable(model: Model): RuleTable {
  switch (model.kind) {
    case "eca":
      return ecaTable(model.rule);
    case "ca":
      return { k: model.k, r: model.r, table: Uint8Array.from(model.table) };
    case "iterate":
      return iterateTable(modelRuleTable(model.base), model.steps);
    case "supercell":
      return supercellTable(modelRuleTable(model.base), model.block, model.steps);
    default:
      throw new TypeError(`${model.kind} is not a cellular automaton`);
  }
}

/** The canonical model of a rule table: an ECA when k = 2 and r = 1. */
export function ruleTableModel(t: RuleTable): Model {
  if (t.k === 2 && t.r === 1) return { kind: "eca", rule: t.table.reduce((rule, v, i) => rule | (v << i), 0) };
  return { kind: "ca", k: t.k, r: t.r, table: Array.from(t.table) };
}

/** Number of states of a chain-like model. */
export function chainSize(model: Model): number {
  if (model.kind === "markov") return model.matrix.length;
  if (model.kind === "decimated") return chainSize(model.base);
  throw new TypeError(`${model.kind} is not a Markov chain`);
}

/** The transition matrix of a chain-like model (a decimation is computed by repeated squaring). */
export function modelMatrix(model: Model): Matrix {
  if (model.kind === "markov") return model.matrix.map((row) => row.map(parseRational));
  if (model.kind === "decimated") return matrixPower(modelMatrix(model.base), model.steps);
  throw new TypeError(`${model.kind} is not a Markov chain`);
}

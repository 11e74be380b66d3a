/** Models (the nodes of the atlas): Markov chains, ECAs, 1-D CAs and derived models, in canonical form. */
export { ModelSchema } from "./schema";
export type { Model, ModelInput } from "./schema";
export { ModelInputError, joinPath } from "./modelIssue";
export type { Issue } from "./modelIssue";
export { canonicalModel, isCaLike, isChainLike } from "./canonicalModel";
export { modelAddress, modelsEqual } from "./modelAddress";
export { describeModel } from "./describeModel";
export { caShape, chainSize, modelMatrix, modelRuleTable, ruleTableModel } from "./modelShape";
export { sha256Hex } from "./sha256";

/** 1-D cellular automata: rule tables, iterates, supercells and the exhaustive projection check (DOMAIN.md §1–2). */
export type { RuleTable } from "./ruleTable";
export { CaInputError, MAX_TABLE_ENTRIES, assertRuleTable, ecaTable, ecaRuleOf, neighbourhoodCount, supercellRadius } from "./ruleTable";
export { evolveCells, toDigits, fromDigits } from "./evolveCells";
export { iterateTable } from "./iterateTable";
export { supercellTable } from "./supercellTable";
export { supercellTablePlain, supercellShape } from "./supercellTablePlain";
export { checkProjection, coarseAlphabet, cellString } from "./checkProjection";
export type { CheckProjectionOptions, ProjectionCheck, ProjectionCounterexample, WindowWitness } from "./checkProjection";
export { spaceTime, spaceTimeRow, MAX_SPACE_TIME_CELLS } from "./spaceTime";
export type { SpaceTime } from "./spaceTime";
export { randomRow, singleCellRow, parseRow } from "./spaceTimeRows";
export { commutingPicture, projectRow } from "./spaceTimePicture";
export type { CommutingPicture, CommutingPictureInput } from "./spaceTimePicture";
export { totalisticCode } from "./totalisticCode";

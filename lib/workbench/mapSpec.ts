/** A map's parameters as a person chose them on the workbench (the source model comes from the canvas). */
export type MapSpec =
  | { kind: "projection"; block: number; projection: number[] }
  | { kind: "lumping"; partition: number[] }
  | { kind: "decimation"; steps: number }
  | { kind: "iterate"; steps: number }
  | { kind: "blocking"; block: number };

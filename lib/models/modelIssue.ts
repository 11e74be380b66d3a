/** A problem with a model, located by a JSON path ("matrix.2.1"). */
export type Issue = { path: string; message: string };

export class ModelInputError extends Error {
  constructor(readonly issues: Issue[]) {
    super(issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join("; "));
    this.name = "ModelInputError";
  }
}

export function joinPath(path: readonly PropertyKey[]): string {
  return path.map(String).join(".");
}

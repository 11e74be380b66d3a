/** What a server action hands back to its form: field errors, one message, and the values to show again. */
export type FormState<Field extends string = string> = {
  status: "idle" | "error" | "ok";
  message?: string;
  fieldErrors?: Partial<Record<Field, string[]>>;
  values?: Partial<Record<Field, string>>;
};

export const IDLE: FormState = { status: "idle" };

/** Field errors from a zod `safeParse` failure, keyed by top-level field. */
export function fieldErrorsOf<Field extends string>(issues: readonly { path: readonly PropertyKey[]; message: string }[]) {
  const errors: Partial<Record<Field, string[]>> = {};
  for (const issue of issues) {
    const key = String(issue.path[0] ?? "form") as Field;
    (errors[key] ??= []).push(issue.message);
  }
  return errors;
}

import type { FormState } from "./form-state";

/** The form-wide message of a server action's state (a refusal, or a confirmation), announced politely. */
export function FormMessage({ state, id = "form-message" }: { state: FormState; id?: string }) {
  return (
    <div id={id} aria-live="polite" aria-atomic="true">
      {state.message ? (
        <p
          role={state.status === "error" ? "alert" : "status"}
          className={`rounded-md px-3 py-2 text-sm ${
            state.status === "error" ? "bg-brick-50 text-brick-700" : "bg-moss-50 text-moss-700"
          }`}
        >
          {state.message}
        </p>
      ) : null}
    </div>
  );
}

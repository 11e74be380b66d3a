import type { InputHTMLAttributes } from "react";

/**
 * A labelled input with its errors directly beneath it, linked by `aria-describedby` and announced
 * through `aria-live`, so a screen reader hears the error of the field it is on.
 */
export function Field({
  name,
  label,
  hint,
  errors,
  ...input
}: InputHTMLAttributes<HTMLInputElement> & { name: string; label: string; hint?: string; errors?: string[] }) {
  const errorId = `${name}-error`;
  const hintId = hint ? `${name}-hint` : undefined;
  const invalid = Boolean(errors?.length);
  return (
    <div className="space-y-1.5">
      <label htmlFor={name} className="block text-sm font-medium text-ink">
        {label}
      </label>
      <input
        id={name}
        name={name}
        aria-invalid={invalid || undefined}
        aria-describedby={[hintId, errorId].filter(Boolean).join(" ")}
        className={`block w-full rounded-md border bg-paper-raised px-3 py-2 text-sm text-ink shadow-inner shadow-black/[0.02] placeholder:text-ink-faint focus:border-tide-600 focus:outline-none focus:ring-2 focus:ring-tide-100 ${
          invalid ? "border-brick-600" : "border-line-strong"
        }`}
        {...input}
      />
      {hint ? (
        <p id={hintId} className="text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
      <div id={errorId} aria-live="polite" aria-atomic="true">
        {errors?.map((e) => (
          <p key={e} className="text-sm text-brick-700">
            {e}
          </p>
        ))}
      </div>
    </div>
  );
}

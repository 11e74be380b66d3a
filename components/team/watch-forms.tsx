"use client";

import { useActionState, useState } from "react";
import { FormMessage } from "@/components/ui/form-message";
import { distinctNames } from "@/components/ui/distinctNames";
import type { FormState } from "@/components/ui/form-state";
import { SubmitButton } from "@/components/ui/submit-button";

type Action = (prev: FormState, form: FormData) => Promise<FormState>;
const select = "block w-full rounded-md border border-line-strong bg-paper-raised px-3 py-2 text-sm text-ink";

/** How watch mail arrives: each event, a daily digest, or none. */
export function DeliveryForm({ current, action }: { current: string; action: Action }) {
  const [state, formAction] = useActionState(action, { status: "idle" } as FormState);
  const options = [
    ["immediate", "One mail per certified or retracted map"],
    ["digest", "One digest mail a day"],
    ["off", "No mail (notifications here only)"],
  ];
  return (
    <form action={formAction} className="space-y-3">
      <fieldset className="space-y-2">
        <legend className="sr-only">Mail</legend>
        {options.map(([value, label]) => (
          <label key={value} className="flex items-center gap-2 text-sm">
            <input type="radio" name="delivery" value={value} defaultChecked={current === value} />
            {label}
          </label>
        ))}
      </fieldset>
      <FormMessage state={state} id="delivery-message" />
      <SubmitButton pendingText="Saving…">Save</SubmitButton>
    </form>
  );
}

/** Watch a class of models or a saved search. */
export function AddWatchForm({ models, kinds, action }: { models: { id: string; name: string; kind: string }[]; kinds: { value: string; label: string }[]; action: Action }) {
  const [state, formAction] = useActionState(action, { status: "idle" } as FormState);
  const [scope, setScope] = useState("class");
  const choices = scope === "lumping-of" ? models.filter((m) => m.kind === "markov" || m.kind === "decimated-chain") : models;
  return (
    <form action={formAction} className="space-y-3">
      <div className="space-y-1.5">
        <label htmlFor="watch-scope" className="block text-sm font-medium text-ink">
          Watch
        </label>
        <select id="watch-scope" name="scope" value={scope} onChange={(e) => setScope(e.target.value)} className={select}>
          <option value="class">every model of a kind</option>
          <option value="onto">anything that coarse-grains onto a model</option>
          <option value="lumping-of">any lumping of a chain</option>
        </select>
      </div>
      {scope === "class" ? (
        <div className="space-y-1.5">
          <label htmlFor="watch-kind" className="block text-sm font-medium text-ink">
            Kind
          </label>
          <select id="watch-kind" name="modelKind" className={select}>
            {kinds.map((k) => (
              <option key={k.value} value={k.value}>
                {k.label}
              </option>
            ))}
          </select>
        </div>
      ) : (
        <div className="space-y-1.5">
          <label htmlFor="watch-model" className="block text-sm font-medium text-ink">
            {scope === "onto" ? "Model" : "Chain"}
          </label>
          <select id="watch-model" name="modelId" className={select}>
            {distinctNames(choices).map((m) => (
              <option key={m.id} value={m.id}>
                {m.label}
              </option>
            ))}
          </select>
        </div>
      )}
      <FormMessage state={state} id="watch-message" />
      <SubmitButton pendingText="Saving…">Start watching</SubmitButton>
    </form>
  );
}

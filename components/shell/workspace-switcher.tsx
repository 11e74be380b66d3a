"use client";

import { useRef } from "react";

type Option = { id: string; name: string; role: string };

/** Chooses the current workspace; the server action sets the `squarely-ws` cookie after checking membership. */
export function WorkspaceSwitcher({ options, currentId, action }: { options: Option[]; currentId: string; action: (form: FormData) => Promise<void> }) {
  const form = useRef<HTMLFormElement>(null);
  return (
    <form ref={form} action={action} className="flex items-center gap-2">
      <label htmlFor="workspace-switch" className="sr-only">
        Workspace
      </label>
      <select
        id="workspace-switch"
        name="workspaceId"
        defaultValue={currentId}
        onChange={() => form.current?.requestSubmit()}
        className="max-w-56 truncate rounded-md border border-tide-700 bg-tide-800 px-2 py-1.5 text-sm text-paper-raised focus:outline-none focus:ring-2 focus:ring-saffron-300"
      >
        {options.map((o) => (
          <option key={o.id} value={o.id}>
            {o.name} · {o.role}
          </option>
        ))}
      </select>
      <noscript>
        <button type="submit" className="text-sm text-tide-100 underline">
          Switch
        </button>
      </noscript>
    </form>
  );
}

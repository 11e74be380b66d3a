"use client";

import { useState } from "react";

type Outcome = { status: "idle" | "busy" | "ok" | "error"; message?: string; href?: string; linkText?: string };

async function readFile(input: HTMLInputElement | null): Promise<unknown> {
  const file = input?.files?.[0];
  if (!file) throw new Error("Choose a file first.");
  try {
    return JSON.parse(await file.text());
  } catch {
    throw new Error(`${file.name} is not a JSON file.`);
  }
}

async function post(url: string, body: unknown): Promise<{ ok: boolean; json: Record<string, unknown> }> {
  const response = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  const json = (await response.json().catch(() => ({}))) as Record<string, unknown>;
  return { ok: response.ok, json };
}

function Result({ outcome, id }: { outcome: Outcome; id: string }) {
  return (
    <div id={id} aria-live="polite">
      {outcome.message ? (
        <p role={outcome.status === "error" ? "alert" : "status"} className={`rounded-md px-3 py-2 text-sm ${outcome.status === "error" ? "bg-brick-50 text-brick-700" : "bg-moss-50 text-moss-700"}`}>
          {outcome.message}{" "}
          {outcome.href ? (
            <a href={outcome.href} className="font-medium underline">
              {outcome.linkText}
            </a>
          ) : null}
        </p>
      ) : null}
    </div>
  );
}

const button = "rounded-md bg-tide-700 px-3 py-1.5 text-sm font-semibold text-paper-raised hover:bg-tide-800 disabled:opacity-60";
const fileInput = "block w-full text-sm file:mr-3 file:rounded-md file:border-0 file:bg-tide-50 file:px-3 file:py-1.5 file:text-tide-800";

/** Imports a workspace bundle into a new workspace: the server re-verifies every certificate first. */
export function ImportBundleForm() {
  const [outcome, setOutcome] = useState<Outcome>({ status: "idle" });
  const [name, setName] = useState("");
  return (
    <form
      className="space-y-3"
      onSubmit={async (e) => {
        e.preventDefault();
        setOutcome({ status: "busy", message: "Checking every certificate again…" });
        try {
          const bundle = await readFile(e.currentTarget.querySelector<HTMLInputElement>("#bundle-file"));
          const { ok, json } = await post("/api/workspace/import", { bundle, into: "new", ...(name.trim() ? { name: name.trim() } : {}) });
          if (!ok) return setOutcome({ status: "error", message: String((json.error as { message?: string } | undefined)?.message ?? json.message ?? "The import was refused.") });
          const imported = json.imported as { models: number; maps: number; chains: number };
          const workspace = json.workspace as { name: string };
          setOutcome({
            status: "ok",
            message: `Imported ${imported.models} models, ${imported.maps} maps and ${imported.chains} chains into the new workspace “${workspace.name}”, every certificate verified again. Switch to it in the workspace menu.`,
          });
        } catch (err) {
          setOutcome({ status: "error", message: err instanceof Error ? err.message : String(err) });
        }
      }}
    >
      <div className="space-y-1">
        <label htmlFor="bundle-file" className="block text-sm font-medium">
          Workspace bundle (.squarely.json)
        </label>
        <input id="bundle-file" type="file" accept=".json,application/json" required className={fileInput} aria-describedby="bundle-result" />
      </div>
      <div className="space-y-1">
        <label htmlFor="bundle-name" className="block text-sm font-medium">
          Name of the new workspace <span className="font-normal text-ink-faint">(optional; the bundle&apos;s name by default)</span>
        </label>
        <input id="bundle-name" value={name} onChange={(e) => setName(e.target.value)} maxLength={120} className="block w-full rounded-md border border-line-strong bg-paper-raised px-3 py-2 text-sm" />
      </div>
      <Result outcome={outcome} id="bundle-result" />
      <button type="submit" disabled={outcome.status === "busy"} className={button}>
        {outcome.status === "busy" ? "Importing…" : "Import into a new workspace"}
      </button>
    </form>
  );
}

/** Uploads one certificate file; the server verifies it before storing anything. */
export function UploadCertificateForm() {
  const [outcome, setOutcome] = useState<Outcome>({ status: "idle" });
  return (
    <form
      className="space-y-3"
      onSubmit={async (e) => {
        e.preventDefault();
        setOutcome({ status: "busy", message: "Verifying…" });
        try {
          const certificate = await readFile(e.currentTarget.querySelector<HTMLInputElement>("#certificate-file"));
          const { ok, json } = await post("/api/certificates", { certificate });
          if (!ok) return setOutcome({ status: "error", message: String((json.error as { message?: string } | undefined)?.message ?? json.message ?? "The certificate was refused.") });
          setOutcome({
            status: "ok",
            message: json.status === "created" ? "Verified and stored." : "Verified; this certificate was already in the atlas.",
            href: `/atlas/maps/${String(json.mapId)}`,
            linkText: "Open the map",
          });
        } catch (err) {
          setOutcome({ status: "error", message: err instanceof Error ? err.message : String(err) });
        }
      }}
    >
      <div className="space-y-1">
        <label htmlFor="certificate-file" className="block text-sm font-medium">
          Certificate (JSON)
        </label>
        <input id="certificate-file" type="file" accept=".json,application/json" required className={fileInput} aria-describedby="certificate-result" />
      </div>
      <Result outcome={outcome} id="certificate-result" />
      <button type="submit" disabled={outcome.status === "busy"} className={button}>
        {outcome.status === "busy" ? "Verifying…" : "Verify and store"}
      </button>
    </form>
  );
}

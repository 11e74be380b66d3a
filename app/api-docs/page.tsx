import type { Metadata } from "next";
import { openApiDocument } from "@/app/api/_lib/openapi";
import { PageHeader } from "@/components/atlas/page-header";
import { Panel } from "@/components/ui/panel";

export const metadata: Metadata = { title: "API · Squarely" };

type Schema = { $ref?: string; type?: string | string[]; enum?: unknown[]; description?: string; items?: Schema; default?: unknown };
type Parameter = { name: string; in: string; required?: boolean; description?: string; schema?: Schema };
type Operation = {
  summary?: string;
  description?: string;
  tags?: string[];
  security?: unknown[];
  parameters?: Parameter[];
  requestBody?: { content: Record<string, { schema: Schema }> };
  responses: Record<string, { description: string; content?: Record<string, { schema: Schema }> }>;
};

const METHODS = ["get", "post", "put", "patch", "delete"] as const;

function typeOf(schema?: Schema): string {
  if (!schema) return "";
  if (schema.$ref) return schema.$ref.split("/").pop() ?? "";
  if (schema.enum) return schema.enum.map((v) => JSON.stringify(v)).join(" | ");
  if (schema.type === "array") return `${typeOf(schema.items)}[]`;
  return Array.isArray(schema.type) ? schema.type.join(" | ") : (schema.type ?? "object");
}

/** The API reference, rendered from the same OpenAPI document that /api/openapi.json serves. */
export default function ApiDocsPage() {
  const doc = openApiDocument() as unknown as {
    info: { title: string; description?: string; version: string };
    paths: Record<string, Partial<Record<(typeof METHODS)[number], Operation>>>;
    components?: { schemas?: Record<string, unknown> };
  };
  const operations = Object.entries(doc.paths).flatMap(([path, item]) =>
    METHODS.filter((m) => item[m]).map((method) => ({ path, method, op: item[method]! })),
  );
  const byTag = new Map<string, typeof operations>();
  for (const o of operations) {
    const tag = o.op.tags?.[0] ?? "other";
    byTag.set(tag, [...(byTag.get(tag) ?? []), o]);
  }
  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow={`OpenAPI ${"3.1"} · version ${doc.info.version}`}
        title={doc.info.title}
        lead={doc.info.description}
        actions={
          <a className="text-sm font-medium text-tide-700 underline" href="/api/openapi.json">
            openapi.json
          </a>
        }
      />
      <Panel title="Authentication">
        <p className="text-sm text-ink">
          Send a personal API token as <code className="font-mono">Authorization: Bearer sqt_…</code> (create one on the{" "}
          <a className="underline" href="/settings/tokens">
            API tokens
          </a>{" "}
          page), or call from the browser while signed in. A token acts in its workspace with the lower of its role and yours.
        </p>
      </Panel>
      {[...byTag].map(([tag, ops]) => (
        <section key={tag} aria-labelledby={`tag-${tag}`} className="space-y-4">
          <h2 id={`tag-${tag}`} className="text-xl font-semibold capitalize text-tide-900">
            {tag}
          </h2>
          {ops.map(({ path, method, op }) => (
            <Panel key={`${method} ${path}`}>
              <h3 className="font-mono text-sm">
                <span className="mr-2 rounded bg-tide-100 px-1.5 py-0.5 font-semibold uppercase text-tide-900">{method}</span>
                {path}
              </h3>
              {op.summary ? <p className="mt-2 text-sm font-medium text-ink">{op.summary}</p> : null}
              {op.description ? <p className="mt-1 text-sm text-ink-soft">{op.description}</p> : null}
              {op.parameters?.length ? (
                <div className="mt-3 overflow-x-auto">
                <table className="w-full text-left text-sm">
                  <caption className="sr-only">Parameters of {method.toUpperCase()} {path}</caption>
                  <thead>
                    <tr className="text-ink-soft">
                      <th scope="col" className="py-1 pr-3 font-medium">Parameter</th>
                      <th scope="col" className="py-1 pr-3 font-medium">In</th>
                      <th scope="col" className="py-1 pr-3 font-medium">Type</th>
                      <th scope="col" className="py-1 font-medium">Meaning</th>
                    </tr>
                  </thead>
                  <tbody>
                    {op.parameters.map((p) => (
                      <tr key={`${p.in}-${p.name}`} className="border-t border-line align-top">
                        <td className="py-1 pr-3 font-mono">
                          {p.name}
                          {p.required ? <span className="text-brick-700"> *</span> : null}
                        </td>
                        <td className="py-1 pr-3">{p.in}</td>
                        <td className="py-1 pr-3 font-mono text-xs">{typeOf(p.schema)}</td>
                        <td className="py-1">{p.description ?? p.schema?.description ?? ""}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
                </div>
              ) : null}
              {op.requestBody ? (
                <p className="mt-3 text-sm">
                  Body: <code className="font-mono">{typeOf(op.requestBody.content["application/json"]?.schema)}</code> (JSON)
                </p>
              ) : null}
              <ul className="mt-3 space-y-0.5 text-sm">
                {Object.entries(op.responses).map(([status, r]) => (
                  <li key={status}>
                    <span className="font-mono font-semibold">{status}</span> {r.description}
                    {r.content?.["application/json"] ? (
                      <span className="font-mono text-xs text-ink-soft"> → {typeOf(r.content["application/json"].schema)}</span>
                    ) : null}
                  </li>
                ))}
              </ul>
            </Panel>
          ))}
        </section>
      ))}
      <Panel title="Schemas">
        <div className="space-y-4">
          {Object.entries(doc.components?.schemas ?? {}).map(([name, schema]) => (
            <details key={name} id={`schema-${name}`}>
              <summary className="cursor-pointer font-mono text-sm font-semibold">{name}</summary>
              <pre className="mt-2 overflow-x-auto rounded bg-paper p-3 font-mono text-xs">{JSON.stringify(schema, null, 2)}</pre>
            </details>
          ))}
        </div>
      </Panel>
    </div>
  );
}

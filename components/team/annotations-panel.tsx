import { AnnotationForm } from "@/components/team/annotation-form";
import { Panel } from "@/components/ui/panel";
import { annotateAction } from "@/app/curate/actions";
import { listAnnotations } from "@/db/queries/notes";
import { can, type Role } from "@/lib/policy";
import { parseReference, referenceUrl } from "@/lib/references";

/** Notes, tags and "published in" references of a model or map, with the form for contributors and up. */
export async function AnnotationsPanel({ workspaceId, role, subjectType, subjectId }: { workspaceId: string; role: Role; subjectType: "model" | "map"; subjectId: string }) {
  const items = await listAnnotations({ workspaceId, subjectType, subjectId });
  const tags = items.filter((a) => a.kind === "tag");
  const refs = items.filter((a) => a.kind === "published");
  const notes = items.filter((a) => a.kind === "note");
  return (
    <Panel title="Notes and tags">
      <div className="grid gap-6 md:grid-cols-[1.4fr_1fr]">
        <div className="space-y-4">
          {tags.length > 0 ? (
            <ul className="flex flex-wrap gap-1.5" aria-label="Tags">
              {tags.map((t) => (
                <li key={t.id} className="rounded-full bg-tide-50 px-2 py-0.5 text-xs font-medium text-tide-800">
                  {t.text}
                </li>
              ))}
            </ul>
          ) : null}
          {refs.length > 0 ? (
            <ul className="space-y-1 text-sm" aria-label="Published in">
              {refs.map((r) => {
                const ref = parseReference(r.text.replace(/^(doi|arxiv):/, ""));
                return (
                  <li key={r.id}>
                    Published in{" "}
                    {ref ? (
                      <a href={referenceUrl(ref)} className="font-mono text-tide-700 underline" rel="noreferrer">
                        {r.text}
                      </a>
                    ) : (
                      <span className="font-mono">{r.text}</span>
                    )}
                  </li>
                );
              })}
            </ul>
          ) : null}
          {notes.length > 0 ? (
            <ul className="space-y-2">
              {notes.map((n) => (
                <li key={n.id} className="border-l-2 border-tide-100 pl-3 text-sm">
                  <p className="whitespace-pre-wrap">{n.text}</p>
                  <p className="text-xs text-ink-faint">{n.authorName ?? "someone"}</p>
                </li>
              ))}
            </ul>
          ) : null}
          {items.length === 0 ? <p className="text-sm text-ink-soft">No notes, tags or references yet.</p> : null}
        </div>
        {can(role, "annotation:note") ? (
          <AnnotationForm subjectType={subjectType} subjectId={subjectId} action={annotateAction} />
        ) : (
          <p className="text-sm text-ink-soft">Contributors and up can add notes and tags.</p>
        )}
      </div>
    </Panel>
  );
}

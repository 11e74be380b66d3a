import type { Metadata } from "next";
import { NewWorkspaceForm } from "@/components/team/new-workspace-form";
import { requireUser } from "@/server/context";
import { createWorkspaceAction } from "../actions";

export const metadata: Metadata = { title: "New workspace" };

export default async function NewWorkspacePage() {
  await requireUser();
  return (
    <div className="mx-auto max-w-md px-5 py-12">
      <section className="rounded-[var(--radius-card)] border border-line bg-paper-raised p-6 shadow-sm">
        <h1 className="text-2xl font-semibold tracking-tight text-tide-900">New workspace</h1>
        <p className="mt-2 text-sm text-ink-soft">A shared atlas for a team. You will be its admin and can invite the others.</p>
        <div className="mt-5">
          <NewWorkspaceForm action={createWorkspaceAction} />
        </div>
      </section>
    </div>
  );
}

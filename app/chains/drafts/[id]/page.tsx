import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/atlas/page-header";
import { Workbench } from "@/components/workbench/workbench";
import { emptyWorkbench, type Workbench as Canvas } from "@/components/workbench/workbenchState";
import { getVisibleDraft } from "@/db/queries/drafts";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";

type Props = { params: Promise<{ id: string }> };

export const metadata: Metadata = { title: "Workbench draft" };

function canvasOf(body: string): Canvas {
  try {
    const parsed = JSON.parse(body) as Partial<Canvas>;
    return { ...emptyWorkbench, ...parsed, chain: { ...emptyWorkbench.chain, ...parsed.chain } };
  } catch {
    return emptyWorkbench;
  }
}

export default async function DraftPage({ params }: Props) {
  const [{ id }, { workspace, user, role }] = await Promise.all([params, getWorkspaceContext()]);
  const draft = await getVisibleDraft({ workspaceId: workspace.id, userId: user.id, draftId: id });
  if (!draft) notFound();
  const mine = draft.ownerId === user.id;
  const canCertify = can(role, "chain:submit");
  return (
    <div className="mx-auto max-w-[96rem] space-y-4 px-4 py-6">
      <PageHeader
        eyebrow={
          <Link href="/chains" className="underline-offset-2 hover:underline">
            Chains
          </Link>
        }
        title="Workbench"
        lead={mine ? "Your draft saves itself as you work." : `A draft shared by ${draft.ownerName}, read-only.`}
      />
      <Workbench
        draft={{ id: draft.id, name: draft.name, shared: draft.shared, mine, ownerName: draft.ownerName }}
        canvas={canvasOf(draft.body)}
        canEdit={mine && canCertify}
        canCertify={canCertify}
      />
    </div>
  );
}

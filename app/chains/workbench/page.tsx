import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/atlas/page-header";
import { Workbench } from "@/components/workbench/workbench";
import { emptyWorkbench } from "@/components/workbench/workbenchState";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";

export const metadata: Metadata = { title: "Workbench" };

export default async function WorkbenchPage() {
  const { role } = await getWorkspaceContext();
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
        lead="Make models, draw the coarse-grainings you believe in, and certify them: the server checks every new map and then the whole chain. The canvas saves itself as a draft."
      />
      <Workbench draft={null} canvas={emptyWorkbench} canEdit={canCertify} canCertify={canCertify} />
    </div>
  );
}

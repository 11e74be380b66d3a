import type { Metadata } from "next";
import Link from "next/link";
import { ImportBundleForm, UploadCertificateForm } from "@/components/atlas/exchange-forms";
import { PageHeader } from "@/components/atlas/page-header";
import { Panel } from "@/components/ui/panel";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";

export const metadata: Metadata = { title: "Export and import" };

export default async function ExchangePage() {
  const { workspace, role } = await getWorkspaceContext();
  const link = "inline-block rounded-md px-3 py-1.5 text-sm font-medium text-tide-700 ring-1 ring-inset ring-line-strong hover:bg-tide-50";
  return (
    <div className="mx-auto max-w-4xl space-y-6 px-5 py-8">
      <PageHeader
        eyebrow={
          <Link href="/atlas" className="underline-offset-2 hover:underline">
            Atlas
          </Link>
        }
        title="Export and import"
        lead={`Move ${workspace.name} to another installation, or hand it to a graph tool.`}
      />
      <Panel title="Export this workspace">
        <div className="space-y-3 text-sm text-ink-soft">
          <p>
            <a href="/api/workspace/export?format=json" className={link} download>
              Download the workspace bundle (JSON)
            </a>{" "}
            — every model, certificate, map, chain and recorded search, referred to by content address. Another installation imports it unchanged and checks every certificate again.
          </p>
          <p>
            <a href="/api/workspace/export?format=graphml" className={link} download>
              Download the atlas as GraphML
            </a>{" "}
            — models as nodes, maps as directed edges with kind, block size, steps and certificate, for general graph tools.
          </p>
        </div>
      </Panel>
      <Panel title="Import a workspace bundle">
        <p className="mb-3 text-sm text-ink-soft">Creates a new workspace, of which you become admin. Nothing in the file is trusted: if any certificate fails to verify, it is named and nothing is imported.</p>
        <ImportBundleForm />
      </Panel>
      {can(role, "certificate:submit") ? (
        <Panel title="Upload a certificate">
          <p className="mb-3 text-sm text-ink-soft">A certificate file from a colleague or the command line: the server runs the checker on it before anything is stored.</p>
          <UploadCertificateForm />
        </Panel>
      ) : null}
    </div>
  );
}

import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/components/atlas/page-header";
import { smallestBlockTable, type RuleCell } from "@/components/atlas/smallestBlocks";
import { Panel } from "@/components/ui/panel";
import { listEcaCongruenceRecords } from "@/db/queries/search";
import { can } from "@/lib/policy";
import { getWorkspaceContext } from "@/server/context";

export const metadata: Metadata = { title: "Smallest block sizes" };

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

function RuleLinks({ rules }: { rules: RuleCell[] }) {
  return (
    <ul className="flex flex-wrap gap-1">
      {rules.map((c) => (
        <li key={c.rule}>
          <Link
            href={`/atlas/models/${c.modelId}`}
            title={c.classes ? `ECA ${c.rule}: ${c.classes} classes` : `ECA ${c.rule}`}
            className="inline-block min-w-10 rounded-md bg-tide-50 px-1.5 py-0.5 text-center font-mono text-xs text-tide-800 hover:bg-tide-100"
          >
            {c.rule}
          </Link>
        </li>
      ))}
    </ul>
  );
}

/** The smallest block size with a proper partition coarse-graining, per ECA, from the recorded congruence searches (the eca-atlas job, search "partitions"). */
export default async function SmallestBlockPage() {
  const { workspace, role } = await getWorkspaceContext();
  const table = smallestBlockTable(await listEcaCongruenceRecords({ workspaceId: workspace.id }));
  const searched = 256 - table.unsearched.length;
  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <PageHeader
        eyebrow={
          <Link href="/atlas" className="underline-offset-2 hover:underline">
            Atlas
          </Link>
        }
        title="Smallest block sizes"
        lead="For each elementary CA, the smallest block size N at which some proper partition of the 2ᴺ block states is a congruence (a coarse-graining onto a CA with fewer symbols, T = N), read from the recorded searches. A “none up to N” is an exhaustive negative result, citable through the rule's search record."
      />
      {searched === 0 ? (
        <Panel>
          <p className="text-sm text-ink-soft">
            No congruence search of the ECAs is recorded in this workspace yet.{" "}
            {can(role, "job:create") ? (
              <>
                Start an <span className="font-medium">ECA atlas</span> job on the{" "}
                <Link href="/jobs" className="text-tide-800 underline">
                  jobs page
                </Link>{" "}
                with “partitions” and a largest block size up to 9.
              </>
            ) : (
              "A contributor can start one (the ECA atlas job, partitions, block sizes up to 9)."
            )}
          </p>
        </Panel>
      ) : (
        <Panel title={`${plural(searched, "rule")} searched`}>
          <dl className="space-y-4 text-sm">
            {table.byBlock.map((g) => (
              <div key={`n${g.block}`} className="grid gap-1 sm:grid-cols-[11rem_1fr]">
                <dt className="font-medium">
                  N = {g.block} <span className="font-normal text-ink-faint">({plural(g.rules.length, "rule")})</span>
                </dt>
                <dd>
                  <RuleLinks rules={g.rules} />
                </dd>
              </div>
            ))}
            {table.none.map((g) => (
              <div key={`none${g.upTo}`} className="grid gap-1 sm:grid-cols-[11rem_1fr]">
                <dt className="font-medium text-brick-700">
                  none up to N = {g.upTo} <span className="font-normal text-ink-faint">({plural(g.rules.length, "rule")})</span>
                </dt>
                <dd>
                  <RuleLinks rules={g.rules} />
                </dd>
              </div>
            ))}
          </dl>
          {table.unsearched.length > 0 ? <p className="mt-4 text-xs text-ink-faint">Not yet searched from block 2: {plural(table.unsearched.length, "rule")}.</p> : null}
        </Panel>
      )}
    </div>
  );
}

import type { Metadata } from "next";
import Link from "next/link";
import { RowAction } from "@/components/team/row-action";
import { AddWatchForm, DeliveryForm } from "@/components/team/watch-forms";
import { Panel } from "@/components/ui/panel";
import { buttonClass } from "@/components/ui/button";
import { getMailDelivery } from "@/db/queries/memberships";
import { countUnreadNotifications, listNotifications } from "@/db/queries/notifications";
import { describeWatch, listWorkspaceWatches } from "@/db/queries/watches";
import { listPublicModels } from "@/db/queries/workspaces";
import { CursorPager } from "@/components/atlas/cursor-pager";
import { getWorkspaceContext } from "@/server/context";
import { isAppError } from "@/server/errors";
import { addWatchAction, markAllReadAction, removeWatchAction, setDeliveryAction } from "./actions";

export const metadata: Metadata = { title: "Notifications" };

const KINDS = [
  { value: "eca", label: "every ECA" },
  { value: "markov", label: "every Markov chain" },
  { value: "ca", label: "every 1-D cellular automaton" },
];

function when(d: Date): string {
  return d.toISOString().slice(0, 16).replace("T", " ") + " UTC";
}

const PAGE = 25;

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

/** A page of notifications; a cursor this server did not give out starts again at the first page. */
async function notificationPage(where: { workspaceId: string; userId: string }, cursor: string | undefined) {
  try {
    return { ...(await listNotifications({ ...where, limit: PAGE, cursor })), cursor };
  } catch (err) {
    if (!cursor || !isAppError(err) || err.code !== "bad_input") throw err;
    return { ...(await listNotifications({ ...where, limit: PAGE })), cursor: undefined };
  }
}

export default async function NotificationsPage({ searchParams }: Props) {
  const [{ user, workspace }, params] = await Promise.all([getWorkspaceContext(), searchParams]);
  const where = { workspaceId: workspace.id, userId: user.id };
  const asked = typeof params.cursor === "string" && params.cursor.length <= 500 ? params.cursor : undefined;
  const [page, unread, delivery, watches, models] = await Promise.all([
    notificationPage(where, asked),
    countUnreadNotifications(where),
    getMailDelivery(where),
    listWorkspaceWatches(where),
    listPublicModels({ workspaceId: workspace.id, limit: 500 }),
  ]);
  return (
    <div className="mx-auto max-w-6xl space-y-6 px-5 py-8">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-sm text-ink-soft">{workspace.name}</p>
          <h1 className="mt-1 text-3xl font-semibold tracking-tight text-tide-900">Notifications</h1>
          <p className="mt-2 text-sm text-ink-soft">
            <span data-testid="unread-count" className="font-semibold text-ink">
              {unread}
            </span>{" "}
            unread
          </p>
        </div>
        {unread > 0 ? (
          <form action={markAllReadAction}>
            <button type="submit" className={buttonClass("secondary")}>
              Mark all read
            </button>
          </form>
        ) : null}
      </div>
      <div className="grid items-start gap-6 lg:grid-cols-[1.6fr_1fr]">
        <Panel title={page.cursor ? "Older notifications" : "Certified and retracted maps you watch"}>
          {page.items.length === 0 ? (
            <p className="text-sm text-ink-soft">Nothing yet. Watch a model, a class or a search, and what gets certified or retracted there appears here.</p>
          ) : (
            <ul className="divide-y divide-line" aria-label="Notifications">
              {page.items.map((n) => (
                <li key={n.id} className={`flex gap-3 py-3 ${n.readAt ? "" : "font-medium"}`}>
                  <span aria-hidden className={`mt-1.5 size-2 shrink-0 rounded-full ${n.readAt ? "bg-transparent" : "bg-saffron-400"}`} />
                  <span className="min-w-0">
                    <Link href={n.link} className="text-sm text-tide-800 hover:underline">
                      {n.title}
                    </Link>
                    {n.readAt ? null : <span className="sr-only"> (unread)</span>}
                    <span className="block text-xs font-normal text-ink-faint">{when(n.createdAt)}</span>
                  </span>
                </li>
              ))}
            </ul>
          )}
          <div className="mt-3">
            <CursorPager filters={{ cursor: page.cursor }} nextCursor={page.nextCursor} base="/notifications" />
          </div>
        </Panel>
        <div className="space-y-6">
          <Panel title="Mail">
            <DeliveryForm current={delivery ?? "immediate"} action={setDeliveryAction} />
          </Panel>
          <Panel title={`You watch (${watches.length})`}>
            {watches.length === 0 ? (
              <p className="mb-4 text-sm text-ink-soft">Nothing yet.</p>
            ) : (
              <ul className="mb-4 divide-y divide-line">
                {watches.map((w) => (
                  <li key={w.id} className="flex items-start justify-between gap-2 py-2 text-sm">
                    <span className="min-w-0 pt-1">{describeWatch(w)}</span>
                    <RowAction action={removeWatchAction} hidden={{ id: w.id, scope: w.scope, modelId: w.modelId ?? "" }} label="Stop" variant="quiet" />
                  </li>
                ))}
              </ul>
            )}
            <AddWatchForm models={models} kinds={KINDS} action={addWatchAction} />
          </Panel>
        </div>
      </div>
    </div>
  );
}

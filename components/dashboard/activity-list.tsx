import type { ActivityItem } from "@/db/queries/notes";

const TIME = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" });

function describe(item: ActivityItem): string {
  if (item.action === "note:post" && typeof item.detail.text === "string") return item.detail.text;
  return `${item.action} · ${item.subjectType}`;
}

export function ActivityList({ items }: { items: ActivityItem[] }) {
  if (items.length === 0) return <p className="text-sm text-ink-faint">Nothing has happened in this workspace yet.</p>;
  return (
    <ol className="space-y-3" aria-label="Recent activity">
      {items.map((item) => (
        <li key={item.id} className="border-l-2 border-tide-100 pl-3">
          <p className={`text-sm ${item.action === "note:post" ? "text-ink" : "font-mono text-ink-soft"}`}>{describe(item)}</p>
          <p className="mt-0.5 text-xs text-ink-faint">
            {item.actorName ?? "someone"} · <time dateTime={item.createdAt.toISOString()}>{TIME.format(item.createdAt)} UTC</time>
          </p>
        </li>
      ))}
    </ol>
  );
}

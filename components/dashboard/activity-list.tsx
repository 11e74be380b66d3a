import Link from "next/link";

/** One line of the workspace log, already in words (server/team/log.ts). */
export type ActivityLine = { id: string; text: string; href: string | null; at: Date; action: string };

const TIME = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" });

export function ActivityList({ items }: { items: ActivityLine[] }) {
  if (items.length === 0) return <p className="text-sm text-ink-faint">Nothing has happened in this workspace yet.</p>;
  return (
    <ol className="space-y-3" aria-label="Recent activity">
      {items.map((item) => (
        <li key={item.id} className={`border-l-2 pl-3 ${item.action === "job" ? "border-saffron-300" : item.action === "note:post" ? "border-tide-300" : "border-tide-100"}`}>
          <p className="text-sm text-ink">
            {item.href ? (
              <Link href={item.href} className="hover:text-tide-700 hover:underline">
                {item.text}
              </Link>
            ) : (
              item.text
            )}
          </p>
          <p className="mt-0.5 text-xs text-ink-faint">
            <time dateTime={item.at.toISOString()}>{TIME.format(item.at)} UTC</time>
          </p>
        </li>
      ))}
    </ol>
  );
}

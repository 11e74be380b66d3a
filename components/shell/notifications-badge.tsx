import Link from "next/link";

/** The header's link to the notification list with the unread count. */
export function NotificationsBadge({ unread }: { unread: number }) {
  return (
    <Link
      href="/notifications"
      className="relative rounded-md px-2.5 py-1.5 text-sm text-tide-100 ring-1 ring-inset ring-tide-700 hover:bg-tide-800 hover:text-paper-raised"
      aria-label={unread > 0 ? `Notifications, ${unread} unread` : "Notifications"}
    >
      Notifications
      {unread > 0 ? (
        <span data-testid="unread-badge" className="ml-1.5 inline-flex min-w-5 justify-center rounded-full bg-saffron-300 px-1.5 text-xs font-semibold text-tide-900">
          {unread > 99 ? "99+" : unread}
        </span>
      ) : null}
    </Link>
  );
}

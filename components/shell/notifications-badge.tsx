import Link from "next/link";

/** The header's link to the notification list with the unread count. */
export function NotificationsBadge({ unread }: { unread: number }) {
  return (
    <Link
      href="/notifications"
      className="relative rounded-md px-2.5 py-1.5 text-sm text-tide-100 ring-1 ring-inset ring-tide-700 hover:bg-tide-800 hover:text-paper-raised"
      aria-label={unread > 0 ? `Notifications, ${unread} unread` : "Notifications"}
    >
      <span className="hidden sm:inline">Notifications</span>
      <svg aria-hidden viewBox="0 0 20 20" className="inline size-4 sm:hidden" fill="currentColor">
        <path d="M10 2a5 5 0 0 0-5 5v3.6L3.3 13.2A1 1 0 0 0 4.1 15h11.8a1 1 0 0 0 .8-1.8L15 10.6V7a5 5 0 0 0-5-5Zm-2 14a2 2 0 0 0 4 0H8Z" />
      </svg>
      {unread > 0 ? (
        <span data-testid="unread-badge" className="ml-1.5 inline-flex min-w-5 justify-center rounded-full bg-saffron-300 px-1.5 text-xs font-semibold text-tide-900">
          {unread > 99 ? "99+" : unread}
        </span>
      ) : null}
    </Link>
  );
}

import Link from "next/link";
import { atlasHref, type AtlasFilters } from "./atlasFilters";

/** Forward-only cursor pagination: the next page, and a way back to the first. */
export function CursorPager({ filters, nextCursor, base = "/atlas" }: { filters: AtlasFilters; nextCursor: string | null; base?: string }) {
  const { cursor, ...rest } = filters;
  if (!cursor && !nextCursor) return null;
  return (
    <nav aria-label="Pages" className="flex items-center justify-between border-t border-line pt-3 text-sm">
      {cursor ? (
        <Link href={atlasHref(rest, base)} className="text-ink-soft underline-offset-2 hover:underline">
          ← First page
        </Link>
      ) : (
        <span />
      )}
      {nextCursor ? (
        <Link href={atlasHref({ ...rest, cursor: nextCursor }, base)} className="font-medium text-ink underline-offset-2 hover:underline">
          Next page →
        </Link>
      ) : null}
    </nav>
  );
}

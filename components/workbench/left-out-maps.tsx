import type { LeftOutMap } from "./requestedMaps";

/**
 * The maps of the workbench's address that are not on the canvas, each named with why (retracted,
 * not found, past the limit), so that a chain opened from a link is never silently shorter.
 */
export function LeftOutMaps({ maps }: { maps: LeftOutMap[] }) {
  if (maps.length === 0) return null;
  const n = maps.length;
  return (
    <section className="space-y-1 rounded-md border border-saffron-500 bg-saffron-50 px-3 py-2 text-sm" aria-labelledby="left-out-heading" data-left-out-maps>
      <h2 id="left-out-heading" className="font-semibold text-saffron-700">
        {n === 1 ? "1 map of this address is not on the canvas" : `${n} maps of this address are not on the canvas`}
      </h2>
      <ul className="list-disc space-y-0.5 pl-5 text-ink-soft">
        {maps.map((m) => (
          <li key={m.id} data-left-out={m.reason} className="break-words">
            {m.href ? (
              <a href={m.href} className="font-medium text-tide-800 underline">
                {m.label}
              </a>
            ) : (
              <span className="font-medium text-ink">{m.label}</span>
            )}
            : {m.why}
          </li>
        ))}
      </ul>
    </section>
  );
}

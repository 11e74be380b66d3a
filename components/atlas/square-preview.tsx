import { squareParts, type SquareInput } from "./tikzSquare";
import { texTokens, type TexNode } from "./texTokens";

function Tex({ nodes }: { nodes: TexNode[] }) {
  return (
    <>
      {nodes.map((n, i) =>
        n.t === "text" ? (
          <span key={i}>{n.text}</span>
        ) : n.t === "sub" ? (
          <sub key={i}>
            <Tex nodes={n.children} />
          </sub>
        ) : (
          <sup key={i}>
            <Tex nodes={n.children} />
          </sup>
        ),
      )}
    </>
  );
}

const tex = (src: string) => <Tex nodes={texTokens(src)} />;

function Horizontal({ label, below = false }: { label: string; below?: boolean }) {
  return (
    <div className="flex flex-col items-center justify-center px-2">
      {below ? null : <span className="text-sm italic">{tex(label)}</span>}
      <span aria-hidden className="flex w-full min-w-16 items-center">
        <span className="h-px flex-1 bg-ink-soft" />
        <span className="-ml-1 text-ink-soft">▸</span>
      </span>
      {below ? <span className="text-sm italic">{tex(label)}</span> : null}
    </div>
  );
}

function Vertical({ label, side }: { label: string; side: "left" | "right" }) {
  return (
    <div className={`flex items-center justify-center gap-1 ${side === "left" ? "flex-row" : "flex-row-reverse"}`}>
      <span className="text-sm italic">{tex(label)}</span>
      <span aria-hidden className="flex h-12 flex-col items-center">
        <span className="w-px flex-1 bg-ink-soft" />
        <span className="-mt-1.5 leading-none text-ink-soft">▾</span>
      </span>
    </div>
  );
}

/**
 * The commuting square drawn with HTML and CSS, from the same parts as the tikz-cd source; a
 * reader sees the square, an author copies the source.
 */
export function SquarePreview({ input }: { input: SquareInput }) {
  const p = squareParts(input);
  const corner = "px-2 py-1 text-center font-serif text-base";
  const described = `Commuting square: ${p.top} on top, ${p.bottom} below, ${p.down} down both sides`;
  return (
    <figure role="img" aria-label={described} className="inline-grid grid-cols-[auto_minmax(5rem,auto)_auto] items-center font-serif text-ink">
      <div className={corner}>{tex(p.topLeft)}</div>
      <Horizontal label={p.top} />
      <div className={corner}>{tex(p.topLeft)}</div>
      <Vertical label={p.down} side="left" />
      <div />
      <Vertical label={p.down} side="right" />
      <div className={corner}>{tex(p.bottomLeft)}</div>
      <Horizontal label={p.bottom} below />
      <div className={corner}>{tex(p.bottomLeft)}</div>
    </figure>
  );
}

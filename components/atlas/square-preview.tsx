import katex from "katex";
// KaTeX's stylesheet: Next bundles it with the fonts it references, so formulas need no CDN.
import "katex/dist/katex.min.css";
import { tikzSquare, type SquareInput } from "./tikzSquare";
import { tikzToCd } from "./tikzToCd";

/** LaTeX rendered by KaTeX on the server (HTML plus MathML for screen readers); an error shows the source in red, never throws. */
export function Formula({ tex, display = false, className = "" }: { tex: string; display?: boolean; className?: string }) {
  const html = katex.renderToString(tex, { displayMode: display, throwOnError: false, output: "htmlAndMathml", strict: "ignore" });
  return <span className={className} dangerouslySetInnerHTML={{ __html: html }} />;
}

/**
 * The commuting square drawn by KaTeX from the very tikz-cd source offered for download (turned
 * into KaTeX's CD environment), so the page and the paper show the same thing.
 */
export function SquarePreview({ input }: { input: SquareInput }) {
  const cd = tikzToCd(tikzSquare(input));
  if (!cd) return <p className="text-sm text-ink-faint">This square has no preview; its tikz-cd source is below.</p>;
  return (
    <figure aria-label="Commuting square" className="max-w-full overflow-x-auto text-ink">
      {/* KaTeX sets the side labels of CD's vertical arrows outside the box: room on both sides keeps them visible. */}
      <div className="inline-block px-16 py-1">
        <Formula tex={cd} display />
      </div>
    </figure>
  );
}

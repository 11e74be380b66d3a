/** One arrow of a tikz-cd cell: its direction letters and label, and whether the label is swapped to the other side ('). */
type Arrow = { dir: string; label: string; swapped: boolean };
type Cell = { object: string; arrows: Arrow[] };

const ARROW = /\\arrow\[\s*([rdlu]+)\s*(?:,\s*"((?:[^"\\]|\\.)*)"\s*('?))?[^\]]*\]/g;

/** Splits on `sep` outside braces and double quotes. */
function splitTop(text: string, sep: string): string[] {
  const parts: string[] = [];
  let depth = 0;
  let quoted = false;
  let start = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === "\\") {
      i++;
      continue;
    }
    if (c === '"') quoted = !quoted;
    else if (!quoted && c === "{") depth++;
    else if (!quoted && c === "}") depth--;
    else if (!quoted && depth === 0 && text.startsWith(sep, i)) {
      parts.push(text.slice(start, i));
      start = i + sep.length;
    }
  }
  parts.push(text.slice(start));
  return parts;
}

function cellOf(text: string): Cell {
  const arrows = [...text.matchAll(ARROW)].map((m) => ({ dir: m[1], label: m[2] ?? "", swapped: m[3] === "'" }));
  return { object: text.replace(ARROW, "").trim(), arrows };
}

/** Rows between \\ separators: a row ends at `\\` followed by a line break or the end (not at `\{`). */
function rowsOf(body: string): string[] {
  return body
    .split(/\\\\\s*(?:\n|$)/)
    .map((r) => r.trim())
    .filter((r) => r.length > 0);
}

/**
 * Turns the 2 × 2 tikz-cd square of the certificate download into KaTeX's CD environment (the
 * amscd syntax KaTeX supports), so the page draws exactly the LaTeX a paper gets: same corners,
 * same labels, on the same sides (a tikz-cd label sits left of the arrow's direction unless
 * swapped with '). Null for any other diagram.
 */
export function tikzToCd(tikz: string): string | null {
  const body = /\\begin\{tikzcd\}([\s\S]*?)\\end\{tikzcd\}/.exec(
    tikz
      .split("\n")
      .filter((l) => !l.trim().startsWith("%"))
      .join("\n"),
  )?.[1];
  if (!body) return null;
  const grid = rowsOf(body).map((row) => splitTop(row, "&").map(cellOf));
  if (grid.length !== 2 || grid.some((row) => row.length !== 2)) return null;
  const [[a, b], [c, d]] = grid;
  const right = (cell: Cell) => cell.arrows.find((x) => x.dir === "r");
  const down = (cell: Cell) => cell.arrows.find((x) => x.dir === "d");
  const horizontal = (arrow: Arrow | undefined) => (!arrow ? "@." : arrow.swapped ? `@>>{${arrow.label}}>` : `@>{${arrow.label}}>>`);
  const vertical = (arrow: Arrow | undefined) => (!arrow ? "@." : arrow.swapped ? `@V{${arrow.label}}VV` : `@VV{${arrow.label}}V`);
  return [
    "\\begin{CD}",
    `${a.object} ${horizontal(right(a))} ${b.object} \\\\`,
    `${vertical(down(a))} ${vertical(down(b))} \\\\`,
    `${c.object} ${horizontal(right(c))} ${d.object}`,
    "\\end{CD}",
  ].join("\n");
}

/** One corner model of a commuting square, as far as its notation needs. */
export type SquareEnd = {
  kind: string;
  rule?: number | null;
  alphabet?: number | null;
  states?: number | null;
};

export type SquareInput = {
  kind: string;
  block?: number | null;
  steps?: number | null;
  source: SquareEnd;
  target: SquareEnd;
  /** `sha256:<hex>`, written as a comment so that the figure stays traceable to its certificate. */
  certificateAddress?: string;
};

const isChain = (end: SquareEnd) => end.kind === "markov" || end.kind === "decimated-chain";

function space(end: SquareEnd): string {
  if (isChain(end)) return end.states ? `\\mathbb{R}^{${end.states}}` : "\\mathbb{R}^{S}";
  const k = end.alphabet ?? (end.kind === "eca" ? 2 : null);
  if (k === 2) return "\\{0,1\\}^{\\mathbb{Z}}";
  if (k) return `\\{0,\\dots,${k - 1}\\}^{\\mathbb{Z}}`;
  return "A^{\\mathbb{Z}}";
}

function dynamics(end: SquareEnd, letter: "f" | "g", chainLetter: "P" | "Q"): string {
  if (isChain(end)) return chainLetter;
  if (end.kind === "supercell") return letter.toUpperCase();
  return end.rule !== null && end.rule !== undefined ? `${letter}_{${end.rule}}` : letter;
}

const power = (symbol: string, n: number | null | undefined) => (n && n > 1 ? `${symbol}^{${n}}` : symbol);

/**
 * The commuting square a map certifies, as a tikz-cd diagram: the source dynamics on top, the target
 * dynamics below, the map down both sides. Chains act on row vectors (strong lumpability as
 * P V = V Q, Kemeny & Snell 1960, §6.3); CAs act on configurations (Israeli & Goldenfeld 2006).
 */
export function tikzSquare(input: SquareInput): string {
  const { topLeft, bottomLeft, top, bottom, down } = squareParts(input);
  const lines = [
    "% \\usepackage{tikz-cd}",
    ...(input.certificateAddress ? [`% certificate ${input.certificateAddress}`] : []),
    "\\begin{tikzcd}",
    `  ${topLeft} \\arrow[r, "${top}"] \\arrow[d, "${down}"'] & ${topLeft} \\arrow[d, "${down}"] \\\\`,
    `  ${bottomLeft} \\arrow[r, "${bottom}"'] & ${bottomLeft}`,
    "\\end{tikzcd}",
  ];
  return lines.join("\n");
}

/** The corners and arrows of the square, each in LaTeX: spaces on the left, maps on the arrows. */
export function squareParts(input: SquareInput): { topLeft: string; bottomLeft: string; top: string; bottom: string; down: string } {
  const { kind, block, source, target } = input;
  const steps = input.steps ?? block ?? null;
  const topLeft = space(source);
  let bottomLeft = space(target);
  let top = dynamics(source, "f", "P");
  const bottom = dynamics(target, "g", "Q");
  let down = "\\mathrm{id}";

  switch (kind) {
    case "lumping":
      down = "V_{\\pi}";
      break;
    case "decimation":
      top = power(top, steps);
      break;
    case "iterate":
      top = power(top, steps);
      break;
    case "blocking":
      top = power(top, steps);
      down = `B_{${block ?? "N"}}`;
      if (!target.alphabet) bottomLeft = `(${stripZ(topLeft)}^{${block ?? "N"}})^{\\mathbb{Z}}`;
      break;
    case "projection":
      // From a supercell model the square is F / π; from the base CA it is blocking then projection.
      if (source.kind === "supercell") {
        down = "\\pi";
        break;
      }
      top = power(top, steps);
      down = `\\pi \\circ B_{${block ?? "N"}}`;
      break;
    case "coarse-graining":
      top = power(top, steps);
      down = `\\pi \\circ B_{${block ?? "N"}}`;
      break;
  }

  return { topLeft, bottomLeft, top, bottom, down };
}

function stripZ(configurationSpace: string): string {
  return configurationSpace.replace(/\^\{\\mathbb\{Z\}\}$/, "");
}

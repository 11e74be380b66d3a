import { canonicalCertificate, type Certificate } from "@/lib/certificate";
import { caShape, chainSize, type Model } from "@/lib/models";

/** One corner model of a commuting square, as far as its notation needs (used when no certificate is at hand). */
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
  /**
   * The certificate itself (its JSON text or value). When given, the square is drawn from it alone — the
   * equation its checker evaluates, with its own block, steps and models — and the fields above are ignored.
   */
  certificate?: unknown;
};

export type SquareParts = { topLeft: string; bottomLeft: string; top: string; bottom: string; down: string };

/**
 * The commuting square a map certifies, as a tikz-cd diagram: the source dynamics on top, the target
 * dynamics below, the map down both sides. Chains act on row vectors (strong lumpability as
 * P^s V = V Q, Kemeny & Snell 1960, §6.3); CAs act on configurations (Israeli & Goldenfeld 2006).
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
export function squareParts(input: SquareInput): SquareParts {
  const cert = input.certificate === undefined ? null : readCertificate(input.certificate);
  return cert ? certificateSquare(cert) : metadataSquare(input);
}

function readCertificate(value: unknown): Certificate | null {
  try {
    return canonicalCertificate(typeof value === "string" ? JSON.parse(value) : value);
  } catch {
    return null;
  }
}

/**
 * Exactly the equation lib/verify/checkSquare.ts evaluates for this certificate (FORMAT.md, "What is
 * proved"): the source dynamics to the power map.steps on top, the target's own dynamics below, and down
 * the sides id (decimation, iterate), V_π (lumping), B_N (blocking) or π ∘ B_N (projection); an exact
 * lumping is drawn with the lumped chain on top and U_π down the sides (U_π P^s = Q U_π).
 */
export function certificateSquare(cert: Certificate): SquareParts {
  const { map, source, target } = cert;
  const parts = { topLeft: modelSpace(source), bottomLeft: modelSpace(target), top: power(modelName(source, "f", "P"), map.steps), bottom: modelName(target, "g", "Q") };
  switch (map.kind) {
    case "decimation":
    case "iterate":
      return { ...parts, down: "\\mathrm{id}" };
    case "lumping":
      return { ...parts, down: "V_{\\pi}" };
    case "blocking":
      return { ...parts, down: `B_{${map.block}}` };
    case "projection":
      return { ...parts, down: projectionArrow(map.block) };
    case "exact-lumping":
      // Exact lumpability is U_π P^s = Q U_π (Buchholz 1994), U_π spreading a block's mass uniformly over
      // its states: the arrows run from the lumped chain up to the fine one, so the lumped chain is on top.
      return { topLeft: modelSpace(target), bottomLeft: modelSpace(source), top: modelName(target, "g", "Q"), bottom: parts.top, down: "U_{\\pi}" };
  }
}

/** The LaTeX name of a model's dynamics: f_{110}, f_{110}^{2} (an iterate), S_{3}[f_{54}^{3}] (a supercell), P^{4} (a decimated chain). */
export function modelName(model: Model, letter: string, chainLetter: string): string {
  switch (model.kind) {
    case "eca":
      return `${letter}_{${model.rule}}`;
    case "ca":
      return letter;
    case "markov":
      return chainLetter;
    case "iterate":
    case "decimated":
      return power(modelName(model.base, letter, chainLetter), model.steps);
    case "supercell":
      return `S_{${model.block}}[${power(modelName(model.base, letter, chainLetter), model.steps)}]`;
  }
}

function modelSpace(model: Model): string {
  if (model.kind === "markov" || model.kind === "decimated") return `\\mathbb{R}^{${chainSize(model)}}`;
  return alphabetSpace(caShape(model).k);
}

function alphabetSpace(k: number | null | undefined): string {
  if (k === 2) return "\\{0,1\\}^{\\mathbb{Z}}";
  if (k) return `\\{0,\\dots,${k - 1}\\}^{\\mathbb{Z}}`;
  return "A^{\\mathbb{Z}}";
}

/** B_1 is the identity, so a block-1 projection is π alone. */
const projectionArrow = (block: number | string) => (block === 1 ? "\\pi" : `\\pi \\circ B_{${block}}`);

/** x^{n}, with x in parentheses when it already carries an exponent; x itself when n = 1. */
function power(symbol: string, n: number | null | undefined): string {
  if (!n || n <= 1) return symbol;
  return /\^\{[^{}]*\}$/.test(symbol) || symbol.startsWith("S_") ? `(${symbol})^{${n}}` : `${symbol}^{${n}}`;
}

const isChain = (end: SquareEnd) => end.kind === "markov" || end.kind === "decimated-chain";

function space(end: SquareEnd): string {
  if (isChain(end)) return end.states ? `\\mathbb{R}^{${end.states}}` : "\\mathbb{R}^{S}";
  return alphabetSpace(end.alphabet ?? (end.kind === "eca" ? 2 : null));
}

function dynamics(end: SquareEnd, letter: "f" | "g", chainLetter: "P" | "Q"): string {
  if (isChain(end)) return chainLetter;
  if (end.kind === "supercell") return letter.toUpperCase();
  return end.rule !== null && end.rule !== undefined ? `${letter}_{${end.rule}}` : letter;
}

/** Without a certificate: drawn from the stored map's kind, block and steps (the same equation, coarser names). */
function metadataSquare(input: SquareInput): SquareParts {
  const { kind, block, source, target } = input;
  const steps = input.steps ?? (kind === "lumping" ? 1 : block) ?? null;
  const topLeft = space(source);
  let bottomLeft = space(target);
  const top = power(dynamics(source, "f", "P"), steps);
  const bottom = dynamics(target, "g", "Q");
  let down = "\\mathrm{id}";
  if (kind === "exact-lumping") return { topLeft: bottomLeft, bottomLeft: topLeft, top: bottom, bottom: top, down: "U_{\\pi}" };
  switch (kind) {
    case "lumping":
      down = "V_{\\pi}";
      break;
    case "blocking":
      down = `B_{${block ?? "N"}}`;
      if (!target.alphabet) bottomLeft = `(${stripZ(topLeft)}^{${block ?? "N"}})^{\\mathbb{Z}}`;
      break;
    case "projection":
    case "coarse-graining":
      down = projectionArrow(block ?? "N");
      break;
  }
  return { topLeft, bottomLeft, top, bottom, down };
}

function stripZ(configurationSpace: string): string {
  return configurationSpace.replace(/\^\{\\mathbb\{Z\}\}$/, "");
}

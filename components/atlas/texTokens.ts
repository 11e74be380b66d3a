/** A piece of a label in the small LaTeX subset the squares use: text, subscripts, superscripts. */
export type TexNode = { t: "text"; text: string } | { t: "sub" | "sup"; children: TexNode[] };

const SYMBOLS: Record<string, string> = {
  "\\pi": "π",
  "\\circ": "∘",
  "\\dots": "…",
  "\\{": "{",
  "\\}": "}",
};
const FONTS: Record<string, Record<string, string>> = { "\\mathbb": { Z: "ℤ", R: "ℝ", N: "ℕ" }, "\\mathrm": {} };

/** Reads `{...}` starting at `i` (just after the brace); returns its content and the index after it. */
function group(src: string, i: number): [string, number] {
  let depth = 1;
  let j = i;
  while (j < src.length && depth > 0) {
    if (src[j] === "\\" && (src[j + 1] === "{" || src[j + 1] === "}")) j += 2;
    else {
      if (src[j] === "{") depth++;
      if (src[j] === "}") depth--;
      j++;
    }
  }
  return [src.slice(i, j - 1), j];
}

/**
 * Parses the LaTeX of a square's labels (`f_{146}^{3}`, `\{0,1\}^{\mathbb{Z}}`, `\pi \circ B_{3}`)
 * into text with sub- and superscripts, so the page can show the square without a TeX engine.
 * Anything outside the subset comes through as plain text.
 */
export function texTokens(src: string): TexNode[] {
  const out: TexNode[] = [];
  const push = (text: string) => {
    const last = out[out.length - 1];
    if (last && last.t === "text") last.text += text;
    else out.push({ t: "text", text });
  };
  let i = 0;
  while (i < src.length) {
    const c = src[i];
    if (c === "_" || c === "^") {
      const t = c === "_" ? "sub" : "sup";
      if (src[i + 1] === "{") {
        const [inner, next] = group(src, i + 2);
        out.push({ t, children: texTokens(inner) });
        i = next;
      } else {
        out.push({ t, children: texTokens(src[i + 1] ?? "") });
        i += 2;
      }
      continue;
    }
    if (c === "\\") {
      const two = src.slice(i, i + 2);
      if (SYMBOLS[two]) {
        push(SYMBOLS[two]);
        i += 2;
        continue;
      }
      const word = /^\\[a-zA-Z]+/.exec(src.slice(i))?.[0] ?? "\\";
      if (FONTS[word] && src[i + word.length] === "{") {
        const [inner, next] = group(src, i + word.length + 1);
        push(FONTS[word][inner] ?? inner);
        i = next;
        continue;
      }
      push(SYMBOLS[word] ?? word.slice(1));
      i += word.length;
      continue;
    }
    if (c === "{" || c === "}") {
      i++;
      continue;
    }
    push(c);
    i++;
  }
  return out;
}

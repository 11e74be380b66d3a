import { malformed, type Refusal } from "./refusal";

/**
 * One pass over a JSON text before it is parsed: refuses nesting deeper than `maxNesting` (so that no
 * parser recurses that deep) and notes the first object with a repeated member name. I-JSON (RFC 7493
 * §2.3) requires member names to be unique, and RFC 8785 canonicalisation builds on I-JSON; a parser
 * that keeps the last value would check a different certificate from the one a reader sees.
 * The duplicate is reported only after the text parsed (`duplicate`), so invalid JSON is called that.
 */
export function scanJsonText(text: string, maxNesting: number): { tooDeep: Refusal | null; duplicate: Refusal | null } {
  const scopes: Scope[] = [];
  let duplicate: Refusal | null = null;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === QUOTE) {
      const end = stringEnd(text, i);
      const top = scopes[scopes.length - 1];
      if (top?.names && nextNonSpace(text, end + 1) === COLON) {
        const name = memberName(text.slice(i, end + 1));
        if (duplicate === null && name !== null && top.names.has(name))
          duplicate = malformed(pathOf(scopes), `the member name ${JSON.stringify(name)} appears twice in one object; I-JSON (RFC 7493 §2.3) requires unique names`);
        if (name !== null) top.names.add(name);
        top.at = name ?? "?";
      }
      i = end;
    } else if (c === OPEN_OBJECT || c === OPEN_ARRAY) {
      if (scopes.length >= maxNesting) return { tooDeep: malformed(scopes.map((s) => String(s.at)).join("."), `nests deeper than ${maxNesting} levels of arrays and objects (maxNesting)`), duplicate };
      scopes.push(c === OPEN_OBJECT ? { names: new Set(), at: "" } : { names: null, at: 0 });
    } else if (c === CLOSE_OBJECT || c === CLOSE_ARRAY) scopes.pop();
    else if (c === COMMA) {
      const top = scopes[scopes.length - 1];
      if (top && top.names === null) top.at = (top.at as number) + 1;
    }
  }
  return { tooDeep: null, duplicate };
}

type Scope = { names: Set<string> | null; at: string | number };

const [QUOTE, BACKSLASH, COLON, COMMA] = [0x22, 0x5c, 0x3a, 0x2c];
const [OPEN_OBJECT, CLOSE_OBJECT, OPEN_ARRAY, CLOSE_ARRAY] = [0x7b, 0x7d, 0x5b, 0x5d];

/** Index of the quote that closes the string opened at `start` (or the last index when it never closes). */
function stringEnd(text: string, start: number): number {
  for (let j = start + 1; j < text.length; j++) {
    const d = text.charCodeAt(j);
    if (d === BACKSLASH) j++;
    else if (d === QUOTE) return j;
  }
  return text.length - 1;
}

function nextNonSpace(text: string, from: number): number {
  for (let j = from; j < text.length; j++) {
    const d = text.charCodeAt(j);
    if (d !== 0x20 && d !== 0x09 && d !== 0x0a && d !== 0x0d) return d;
  }
  return -1;
}

/** The name with its escapes resolved ("\u0072ule" is "rule"), or null when the string is not valid JSON. */
function memberName(quoted: string): string | null {
  try {
    return JSON.parse(quoted) as string;
  } catch {
    return null;
  }
}

function pathOf(scopes: Scope[]): string {
  return scopes
    .slice(0, -1)
    .map((s) => String(s.at))
    .join(".");
}

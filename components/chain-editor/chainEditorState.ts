/** A certified map as the chain editor needs it. */
export type EditorLink = {
  mapId: string;
  kind: string;
  block: number | null;
  steps: number | null;
  summary: string;
  status: "certified" | "retracted";
  source: { id: string; name: string };
  target: { id: string; name: string };
};

/** Why link `index` cannot be followed by link `index + 1`. */
export type LinkBreak = { index: number; expected: { id: string; name: string }; found: { id: string; name: string } };

export type ChainCheck = {
  /** True when the chain has at least one link, every link is certified and each meets the next. */
  ready: boolean;
  breaks: LinkBreak[];
  /** Indices of links whose map was retracted: they cannot be part of a new chain. */
  retracted: number[];
};

export type ServerProblem = { link: number | null; message: string };

export type EditorState = {
  links: EditorLink[];
  /** The server's answer to the last submission; cleared by any edit, since it described another chain. */
  problem: ServerProblem | null;
};

export type EditorAction =
  | { type: "append"; link: EditorLink }
  | { type: "remove"; index: number }
  | { type: "move"; from: number; to: number }
  | { type: "clear" }
  | { type: "server-problem"; problem: ServerProblem };

export const emptyEditor: EditorState = { links: [], problem: null };

export function editorReducer(state: EditorState, action: EditorAction): EditorState {
  switch (action.type) {
    case "append":
      return { links: [...state.links, action.link], problem: null };
    case "remove":
      if (action.index < 0 || action.index >= state.links.length) return state;
      return { links: state.links.filter((_, i) => i !== action.index), problem: null };
    case "move": {
      const { from, to } = action;
      const n = state.links.length;
      if (from === to || from < 0 || to < 0 || from >= n || to >= n) return state;
      const links = [...state.links];
      const [moved] = links.splice(from, 1);
      links.splice(to, 0, moved);
      return { links, problem: null };
    }
    case "clear":
      return emptyEditor;
    case "server-problem":
      return { ...state, problem: action.problem };
  }
}

/**
 * Checks that each link's target is the next link's source (the same stored model, hence the same
 * canonical form) — the condition under which the squares paste into one (DOMAIN §3).
 */
export function checkChain(links: EditorLink[]): ChainCheck {
  const breaks: LinkBreak[] = [];
  for (let i = 0; i + 1 < links.length; i++) {
    if (links[i].target.id !== links[i + 1].source.id) {
      breaks.push({ index: i, expected: links[i].target, found: links[i + 1].source });
    }
  }
  const retracted = links.flatMap((l, i) => (l.status === "retracted" ? [i] : []));
  return { ready: links.length > 0 && breaks.length === 0 && retracted.length === 0, breaks, retracted };
}

/** Maps that can follow the chain as it stands: those starting where its last link ends. */
export function nextCandidates(links: EditorLink[], pool: EditorLink[]): EditorLink[] {
  const last = links[links.length - 1];
  const live = pool.filter((m) => m.status === "certified");
  return last ? live.filter((m) => m.source.id === last.target.id) : live;
}

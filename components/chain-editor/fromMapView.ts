import type { EditorLink } from "./chainEditorState";

/** The fields of a stored map the editor needs (a `MapView` from the atlas queries, or its JSON). */
export type MapLike = {
  id: string;
  kind: string;
  block: number | null;
  steps: number | null;
  summary: string;
  status: "certified" | "retracted";
  source: { id: string; name: string };
  target: { id: string; name: string };
};

export function toEditorLink(map: MapLike): EditorLink {
  return {
    mapId: map.id,
    kind: map.kind,
    block: map.block,
    steps: map.steps,
    summary: map.summary,
    status: map.status,
    source: { id: map.source.id, name: map.source.name },
    target: { id: map.target.id, name: map.target.name },
  };
}

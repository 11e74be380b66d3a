import { getWorkspaceContext } from "@/server/context";
import { AnnotationsPanel } from "./annotations-panel";

/** The model page's notes and tags, reading the viewer's role itself so the page needs one line. */
export async function ModelAnnotations({ workspaceId, modelId }: { workspaceId: string; modelId: string }) {
  const { role } = await getWorkspaceContext();
  return <AnnotationsPanel workspaceId={workspaceId} role={role} subjectType="model" subjectId={modelId} />;
}

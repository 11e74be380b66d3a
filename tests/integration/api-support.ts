import { createApiToken } from "@/db/queries/tokens";
import type { Role } from "@/lib/policy";
import { generateTokenSecret, hashTokenSecret } from "@/server/tokens";

type Handler = (request: Request, context: { params: Promise<never> }) => Promise<Response>;

/** Calls a route handler the way Next does, without a server. */
export async function call(
  handler: unknown,
  {
    path,
    method = "GET",
    body,
    token,
    params = {},
    headers = {},
  }: { path: string; method?: string; body?: unknown; token?: string; params?: Record<string, string>; headers?: Record<string, string> },
): Promise<{ status: number; json: Record<string, unknown> }> {
  // Without a token the call stands for the app's own pages, which a browser marks with their origin.
  const init: RequestInit = { method, headers: token ? { ...headers } : { origin: "http://localhost", ...headers } };
  if (token) (init.headers as Record<string, string>).authorization = `Bearer ${token}`;
  if (body !== undefined) {
    init.body = typeof body === "string" ? body : JSON.stringify(body);
    (init.headers as Record<string, string>)["content-type"] ??= "application/json";
  }
  const res = await (handler as Handler)(new Request(`http://localhost${path}`, init), {
    params: Promise.resolve(params) as Promise<never>,
  });
  const text = await res.text();
  return { status: res.status, json: text ? (JSON.parse(text) as Record<string, unknown>) : {} };
}

/** A token stored the way the app stores it (hash only), returning the secret a script would hold. */
export async function tokenFor(userId: string, workspaceId: string, role: Role, name = `${role} script`): Promise<string> {
  const secret = generateTokenSecret();
  await createApiToken({ userId, workspaceId, name, role, tokenHash: hashTokenSecret(secret), prefix: secret.slice(0, 10) });
  return secret;
}

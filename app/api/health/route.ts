/**
 * A constant answer with no session, token or database: load balancers and the cluster demo ask
 * it whether the process serves, and the API benchmark measures the server's floor with it.
 */
export function GET(): Response {
  return Response.json({ ok: true });
}

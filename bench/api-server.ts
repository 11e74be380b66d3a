/**
 * The child process of bench/api.bench.ts, run as
 *   node --conditions=react-server --import tsx bench/api-server.ts serve <port>
 *   node --conditions=react-server --import tsx bench/api-server.ts paths <json: [[from, to], …]> <workspaceId>
 * with DATABASE_URL pointing at the loaded database. `serve` answers the coarse-grains to/from read
 * with the app's own route handler in a plain node http server (and /baseline with a constant JSON
 * body, the same server's floor); `paths` times depth-4 path queries and prints them as JSON.
 */
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import { GET as mapsOfModel } from "@/app/api/models/[id]/maps/route";
import { findPaths, getModel } from "@/db/queries/atlas";

async function toRequest(req: IncomingMessage): Promise<Request> {
  const headers = new Headers();
  for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
  return new Request(`http://localhost${req.url}`, { method: req.method, headers });
}

async function send(res: ServerResponse, response: Response): Promise<void> {
  const body = Buffer.from(await response.arrayBuffer());
  res.writeHead(response.status, { "content-type": response.headers.get("content-type") ?? "application/json", "content-length": body.length });
  res.end(body);
}

async function serve(port: number): Promise<void> {
  const server = createServer(async (req, res) => {
    try {
      const match = /^\/api\/models\/([^/?]+)\/maps/.exec(req.url ?? "");
      if (req.url === "/baseline") return await send(res, Response.json({ items: [], nextCursor: null }));
      if (!match) return await send(res, Response.json({ error: "not found" }, { status: 404 }));
      await send(res, await mapsOfModel(await toRequest(req), { params: Promise.resolve({ id: decodeURIComponent(match[1]) }) }));
    } catch (err) {
      res.writeHead(500);
      res.end(String(err));
    }
  });
  server.listen(port, "127.0.0.1", () => console.log(JSON.stringify({ listening: port })));
}

async function timePaths(pairs: [string, string][], workspaceId: string): Promise<void> {
  const point: number[] = [];
  const depth4: number[] = [];
  const found: number[] = [];
  for (const [from, to] of pairs) {
    let t0 = performance.now();
    await getModel({ workspaceId, idOrAddress: from });
    point.push(performance.now() - t0);
    t0 = performance.now();
    const paths = await findPaths({ workspaceId, from, to, maxDepth: 4, limit: 100 });
    depth4.push(performance.now() - t0);
    found.push(paths.length);
  }
  console.log(JSON.stringify({ point, depth4, found }));
}

const [mode, ...rest] = process.argv.slice(2);
if (mode === "serve") await serve(Number(rest[0]));
else if (mode === "paths") await timePaths(JSON.parse(rest[0]) as [string, string][], rest[1]);
else throw new Error(`unknown mode ${mode}`);

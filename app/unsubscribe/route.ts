import { z } from "zod";
import { setMailDelivery } from "@/db/queries/memberships";
import { getWorkspaceById } from "@/db/queries/workspaces";
import { env } from "@/env";
import { isUnsubscribeToken } from "@/lib/policy";

const Query = z.object({ w: z.string().min(1).max(200), u: z.string().min(1).max(200), s: z.string().min(1).max(200) });

function page(status: number, title: string, text: string): Response {
  const escape = (v: string) => v.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escape(title)} · Squarely</title>
<style>body{font-family:system-ui,sans-serif;background:#f6f4ef;color:#1d2a33;margin:0}main{max-width:32rem;margin:4rem auto;padding:1.5rem;background:#fff;border:1px solid #ddd6c8;border-radius:10px}h1{font-size:1.4rem;margin:0 0 .75rem}p{line-height:1.5}a{color:#1f5b73}</style></head>
<body><main><h1>${escape(title)}</h1><p>${escape(text)}</p><p><a href="/sign-in">Sign in</a> to choose immediate mail or a daily digest again.</p></main></body></html>`;
  return new Response(html, { status, headers: { "content-type": "text/html; charset=utf-8" } });
}

/**
 * One-click unsubscribe (RFC 8058): the signed link stops watch mail from one workspace for one
 * person, signed in or not. GET is the link opened in a browser; POST is the mail client's
 * List-Unsubscribe-Post. Doing it twice is harmless.
 */
async function unsubscribe(request: Request): Promise<Response> {
  const parsed = Query.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) return page(400, "Link incomplete", "This unsubscribe link is incomplete. Copy the whole link from the mail.");
  const { w, u, s } = parsed.data;
  if (!isUnsubscribeToken({ secret: env.AUTH_SECRET, workspaceId: w, userId: u, token: s }))
    return page(400, "Link not valid", "This unsubscribe link is not valid. Copy the whole link from the mail, or sign in and change your mail settings.");
  const changed = await setMailDelivery({ workspaceId: w, userId: u, delivery: "off" }).catch(() => null);
  if (changed === null) return page(503, "Please try again", "Your mail settings could not be saved just now; nothing was changed.");
  const workspace = await getWorkspaceById({ id: w }).catch(() => null);
  return page(200, "Unsubscribed", `You will get no more watch mail from ${workspace?.name ?? "this workspace"}. Notifications still appear in the app.`);
}

export const GET = unsubscribe;
export const POST = unsubscribe;

import { queueDueDigests } from "@/db/queries/notifications";
import { env } from "@/env";
import { unsubscribeUrl } from "@/lib/policy";

/** Queues the daily digests that are due; the outbox sends them like any other mail. */
export function queueDigests(now: Date): Promise<number> {
  return queueDueDigests({
    now,
    appUrl: env.APP_URL,
    unsubscribeLink: (workspaceId, userId) => unsubscribeUrl({ appUrl: env.APP_URL, secret: env.AUTH_SECRET, workspaceId, userId }),
  });
}

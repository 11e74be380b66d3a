import { env } from "@/env";
import { startMailCatcher, type MailCatcher } from "./catcher";

const globalForCatcher = globalThis as unknown as { squarelyMailCatcher?: Promise<MailCatcher | null> };

/**
 * Starts the catcher on SMTP_PORT once per process when MAIL_CATCHER=on. A port already taken
 * (another app instance, or a standalone catcher) is reported and tolerated: mail still goes there.
 */
export function startConfiguredMailCatcher(): Promise<MailCatcher | null> {
  if (env.MAIL_CATCHER !== "on") return Promise.resolve(null);
  globalForCatcher.squarelyMailCatcher ??= startMailCatcher({ port: env.SMTP_PORT, dir: env.MAIL_CATCHER_DIR }).then(
    (catcher) => {
      console.log(`mail catcher listening on 127.0.0.1:${catcher.port}, keeping messages in ${env.MAIL_CATCHER_DIR}`);
      return catcher;
    },
    (err: NodeJS.ErrnoException) => {
      console.warn(`mail catcher not started (${err.code ?? err.message}); another one may already be listening on ${env.SMTP_PORT}`);
      return null;
    },
  );
  return globalForCatcher.squarelyMailCatcher;
}

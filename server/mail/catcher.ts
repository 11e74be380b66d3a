import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";
import { saveCaughtMessage } from "./store";

export type MailCatcher = { port: number; close: () => Promise<void> };

/**
 * A local SMTP server that accepts every message and keeps it under `dir` instead of delivering it.
 * Demo, development and tests send real SMTP to it, so the production path (nodemailer over SMTP)
 * is the one exercised. It listens on the loopback interface only.
 */
export function startMailCatcher({ port, dir, host = "127.0.0.1" }: { port: number; dir: string; host?: string }): Promise<MailCatcher> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    banner: "Squarely local mail catcher",
    onAuth(_auth, _session, callback) {
      callback(null, { user: "catcher" });
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) =>
          saveCaughtMessage(dir, {
            id: crypto.randomUUID(),
            receivedAt: new Date().toISOString(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            html: typeof parsed.html === "string" ? parsed.html : null,
            messageId: parsed.messageId ?? null,
            listUnsubscribe: headerText((parsed.headers.get("list") as { unsubscribe?: unknown } | undefined)?.unsubscribe),
          }),
        )
        .then(
          () => callback(),
          (err: Error) => callback(err),
        );
    },
  });
  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      server.off("error", reject);
      server.on("error", (err) => console.error("mail catcher:", err));
      const address = server.server.address();
      resolve({
        port: typeof address === "object" && address ? address.port : port,
        close: () => new Promise<void>((done) => server.close(() => done())),
      });
    });
  });
}

/** mailparser folds List-Unsubscribe into the "list" header as `{ url }`; the catcher keeps the header's text form. */
function headerText(value: unknown): string | null {
  if (value == null) return null;
  if (typeof value === "string") return value;
  const url = (value as { url?: unknown }).url;
  return typeof url === "string" ? `<${url}>` : JSON.stringify(value);
}

import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

export type Received = { to: string[]; subject: string; text: string; messageId: string | null; listUnsubscribe: string | null };

/**
 * A throw-away SMTP server for the watchers' mail tests: keeps what it receives in memory and
 * refuses any recipient whose address starts with "bounce" (a permanent 550, as a real host would).
 */
export async function startTestSmtp(port: number): Promise<{ received: Received[]; close: () => Promise<void> }> {
  const received: Received[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    onRcptTo(address, _session, callback) {
      if (address.address.startsWith("bounce")) {
        const err = new Error("mailbox unavailable") as Error & { responseCode: number };
        err.responseCode = 550;
        return callback(err);
      }
      callback();
    },
    onData(stream, session, callback) {
      simpleParser(stream).then(
        (mail) => {
          // mailparser folds the List-* headers (RFC 2369) into one "list" header object.
          const unsubscribe = (mail.headers.get("list") as { unsubscribe?: { url?: string } } | undefined)?.unsubscribe;
          received.push({
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? "",
            text: mail.text ?? "",
            messageId: mail.messageId ?? null,
            listUnsubscribe: unsubscribe?.url ? `<${unsubscribe.url}>` : null,
          });
          callback();
        },
        (err: Error) => callback(err),
      );
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", () => resolve());
  });
  return { received, close: () => new Promise<void>((done) => server.close(() => done())) };
}

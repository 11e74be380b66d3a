/**
 * A delivering process for the crash test in outbox-faults.test.ts: it sends what is due and, after
 * the SMTP server accepted a message but before the row is marked sent, says so on stdout and
 * waits — for the parent's SIGKILL.
 */
import { createDatabase } from "@/db/client";
import { setDatabase } from "@/db/queries/connection";
import { createOutboxDelivery } from "@/server/mail/outbox";
import { sendMail } from "@/server/mail/send";

const db = createDatabase(process.env.DATABASE_URL!);
setDatabase(db);
const delivery = createOutboxDelivery({
  db,
  send: sendMail,
  owner: "doomed-process",
  messageIdDomain: "atlas.test",
  afterSend: async (message) => {
    process.stdout.write(`SENT ${message.id}\n`);
    await new Promise(() => undefined);
  },
});
void delivery.deliverDue();

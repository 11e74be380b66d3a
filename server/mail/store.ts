import { mkdir, readdir, readFile, writeFile } from "node:fs/promises";
import { join } from "node:path";

/** A message the local catcher received; kept as one JSON file so the app and tests can both read it. */
export type CaughtMessage = {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** The Message-ID header as sent (absent in messages caught before it was kept). */
  messageId?: string | null;
  listUnsubscribe?: string | null;
};

export async function saveCaughtMessage(dir: string, message: CaughtMessage): Promise<void> {
  await mkdir(dir, { recursive: true });
  // The time prefix sorts the files in arrival order; the id keeps names unique within a millisecond.
  const name = `${message.receivedAt.replace(/[:.]/g, "-")}-${message.id}.json`;
  await writeFile(join(dir, name), JSON.stringify(message, null, 2));
}

/** Caught messages, newest first; an absent directory means none were caught yet. */
export async function listCaughtMessages(dir: string, { limit = 100 }: { limit?: number } = {}): Promise<CaughtMessage[]> {
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith(".json"));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === "ENOENT") return [];
    throw err;
  }
  names.sort().reverse();
  const messages = await Promise.all(
    names.slice(0, limit).map(async (n) => JSON.parse(await readFile(join(dir, n), "utf8")) as CaughtMessage),
  );
  return messages;
}

import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import nodemailer from "nodemailer";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startMailCatcher, type MailCatcher } from "@/server/mail/catcher";
import { listCaughtMessages } from "@/server/mail/store";

let dir: string;
let catcher: MailCatcher;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), "squarely-mail-"));
  catcher = await startMailCatcher({ port: 0, dir });
}, 60_000);
afterAll(async () => {
  await catcher.close();
  rmSync(dir, { recursive: true, force: true });
});

describe("the local mail catcher", () => {
  it("keeps what an SMTP client sends, newest first, with envelope recipients and both bodies", async () => {
    const client = nodemailer.createTransport({ host: "127.0.0.1", port: catcher.port, secure: false, ignoreTLS: true });
    expect(await listCaughtMessages(dir)).toEqual([]);
    await client.sendMail({ from: "a@example.org", to: "b@example.org", subject: "first", text: "one" });
    await client.sendMail({
      from: "a@example.org",
      to: ["c@example.org", "d@example.org"],
      subject: "Zweite Nachricht — ü",
      text: "two\nlines",
      html: "<p>two</p>",
    });
    const caught = await listCaughtMessages(dir);
    expect(caught.map((m) => [m.subject, m.to, m.text.trim(), m.html])).toEqual([
      ["Zweite Nachricht — ü", ["c@example.org", "d@example.org"], "two\nlines", "<p>two</p>"],
      ["first", ["b@example.org"], "one", null],
    ]);
    expect(caught[0].from).toBe("a@example.org");
  });

  it("refuses to start on a port that is already taken", async () => {
    await expect(startMailCatcher({ port: catcher.port, dir })).rejects.toMatchObject({ code: "EADDRINUSE" });
  });
});

/**
 * Runs once when the server process starts: the local SMTP catcher (MAIL_CATCHER=on) first, so
 * that mail sent by the first jobs is caught.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { startConfiguredMailCatcher } = await import("./server/mail/start");
  await startConfiguredMailCatcher();
  const { startJobRunner } = await import("./server/jobs/runner");
  await startJobRunner();
}

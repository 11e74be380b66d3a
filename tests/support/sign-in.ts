import { mkdirSync } from "node:fs";
import type { Browser, Page } from "playwright-core";

export type Credentials = { email: string; password: string };

/** Fills the password sign-in form at `baseUrl` and submits it; the caller waits for what it expects. */
export async function submitSignIn(page: Page, baseUrl: string, who: Credentials): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.fill("#email", who.email);
  await page.fill("#password", who.password);
  await page.click("form button[type=submit]");
}

/**
 * A page in a fresh browser context (its own cookies), signed in as `who`; returns once the app has
 * left the sign-in page. `width` sets a 900 px tall viewport; without it the browser's default stays.
 */
export async function signedInPage(browser: Browser, baseUrl: string, who: Credentials, options: { width?: number } = {}): Promise<Page> {
  const context = await browser.newContext(options.width ? { viewport: { width: options.width, height: 900 } } : {});
  const page = await context.newPage();
  await submitSignIn(page, baseUrl, who);
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
  return page;
}

/** Full-page screenshots of the current page at 1366 and 390 px wide, as `<dir>/<name>-<width>.png`; the viewport returns to 1366 px. */
export async function screenshotWidths(page: Page, dir: string, name: string): Promise<void> {
  mkdirSync(dir, { recursive: true });
  for (const width of [1366, 390]) {
    await page.setViewportSize({ width, height: 900 });
    await page.screenshot({ path: `${dir}/${name}-${width}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1366, height: 900 });
}

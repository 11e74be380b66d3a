import { chromium, type Browser } from "playwright-core";

/** Debian's chromium, headless, with the flags every browser test uses; never a downloaded browser. */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: "/usr/bin/chromium",
    headless: true,
    args: ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run"],
  });
}

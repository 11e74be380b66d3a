export { createTestDatabase, type TestDatabase } from "./database";
export { startTestServer, type TestServer } from "./server";
export { launchBrowser } from "./browser";
export { freePort } from "./ports";
export { screenshotWidths, signedInPage, submitSignIn, type Credentials } from "./sign-in";

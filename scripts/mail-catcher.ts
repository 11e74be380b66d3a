import { startConfiguredMailCatcher } from "@/server/mail/start";

// `npm run mail`: the catcher on its own, for `next dev` sessions started with MAIL_CATCHER=off.
process.env.MAIL_CATCHER = "on";
startConfiguredMailCatcher().then((catcher) => {
  if (!catcher) process.exit(1);
});

// Runs the local SMTP catcher as its own process (used by the start command).
import { startMailCatcher } from '../lib/fakes/mail/catcher';

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const apiPort = Number(process.env.MAIL_CATCHER_API_PORT ?? 2526);
const dataFile = process.env.MAIL_CATCHER_DATA;

startMailCatcher({ smtpPort, apiPort, dataFile }).then(
  () => console.log(`mail catcher: SMTP on 127.0.0.1:${smtpPort}, messages at http://127.0.0.1:${apiPort}/messages`),
  (err) => {
    console.error('mail catcher failed to start:', err);
    process.exit(1);
  },
);

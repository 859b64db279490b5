// `npm run stop`: stops what `npm start` and `npm test` started.
import { stopDaemon, stopPostgres, profiles, log } from "./services.mjs";

stopDaemon("web");
stopDaemon("web-test");
for (const p of Object.values(profiles)) stopDaemon(`mail-${p.smtpPort}`);
stopPostgres();
log("stopped");

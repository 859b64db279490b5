// `npm run stop`: stops what `npm start` and `npm test` started.
import { stopDaemon, stopPostgres, profiles, log } from "./services.mjs";

stopDaemon("web");
stopDaemon("web-test");
stopDaemon("jobs-worker");
stopDaemon("jobs-worker-test");
for (const p of Object.values(profiles)) stopDaemon(`mail-${p.smtpPort}`);
stopPostgres();
log("stopped");

// The local stand-in for a mail service: accepts SMTP on loopback and keeps
// each message as a JSON file in MAIL_DIR, newest last. Nothing is relayed.
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";

const port = Number(process.env.MAIL_PORT ?? 2525);
const dir = process.env.MAIL_DIR ?? ".data/mail";
mkdirSync(dir, { recursive: true });

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  size: 1024 * 1024,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const id = `${Date.now()}-${Math.random().toString(36).slice(2, 8)}`;
        const record = {
          id,
          receivedAt: new Date().toISOString(),
          from: mail.from?.text ?? "",
          to: session.envelope.rcptTo.map((r) => r.address),
          subject: mail.subject ?? "",
          text: mail.text ?? "",
          html: typeof mail.html === "string" ? mail.html : "",
        };
        writeFileSync(path.join(dir, `${id}.json`), JSON.stringify(record, null, 2));
        callback();
      })
      .catch((e) => callback(e));
  },
});

server.on("error", (e) => {
  console.error(`mail catcher: ${e.message}`);
});
server.listen(port, "127.0.0.1", () => {
  console.log(`mail catcher listening on 127.0.0.1:${port}, keeping messages in ${dir}`);
});
for (const sig of ["SIGTERM", "SIGINT"]) process.on(sig, () => server.close(() => process.exit(0)));

/**
 * The local mail catcher's messages, read from its files (MAIL_DIR, one JSON
 * file per message), as a person would read their inbox.
 */
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";

export interface CaughtMail {
  to: string[];
  subject: string;
  text: string;
  html: string;
  receivedAt: string;
}

const MAIL_DIR = process.env.MAIL_DIR ?? ".data/mail-test";

/** The newest message to `to` whose subject matches, waiting up to `timeoutMs` (default 15 s) for it to arrive. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 15_000): Promise<CaughtMail> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    const files = existsSync(MAIL_DIR) ? readdirSync(MAIL_DIR).filter((f) => f.endsWith(".json")).sort().reverse() : [];
    for (const f of files) {
      let m: CaughtMail;
      try {
        m = JSON.parse(readFileSync(path.join(MAIL_DIR, f), "utf8")) as CaughtMail;
      } catch {
        continue; // being written
      }
      if (m.to.includes(to) && subject.test(m.subject)) return m;
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no mail to ${to} with a subject like ${subject} in ${MAIL_DIR}`);
}

/** The first link in a message's text that starts with `base`. */
export function linkTo(base: string, text: string): URL {
  const m = new RegExp(`${base.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}/\\S+`).exec(text);
  if (!m) throw new Error(`no link to ${base} in: ${text}`);
  return new URL(m[0]);
}

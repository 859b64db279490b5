import "server-only";
/** Outgoing mail over SMTP_URL (the local mail catcher in development and tests). */
import nodemailer, { type Transporter } from "nodemailer";

const g = globalThis as unknown as { fanboundMail?: Transporter };

function transport(): Transporter {
  const url = process.env.SMTP_URL;
  if (!url) throw new Error("SMTP_URL is not set: start the app with `npm start`");
  return (g.fanboundMail ??= nodemailer.createTransport(url));
}

/** The site's own address for links in mail, from NEXTAUTH_URL (default http://127.0.0.1:3000). */
export function siteUrl(path: string): string {
  const base = process.env.NEXTAUTH_URL ?? "http://127.0.0.1:3000";
  return new URL(path, base.endsWith("/") ? base : `${base}/`).toString();
}

/** Sends one plain-text message with an HTML copy whose link is clickable. */
export async function sendMail(p: { to: string; subject: string; lines: string[]; link: { url: string; label: string } }) {
  const esc = (s: string) => s.replace(/[&<>"]/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;" })[c]!);
  const text = [...p.lines, "", `${p.link.label}: ${p.link.url}`, "", "— Fanbound"].join("\n");
  const html =
    p.lines.map((l) => `<p>${esc(l)}</p>`).join("") +
    `<p><a href="${esc(p.link.url)}">${esc(p.link.label)}</a></p><p>— Fanbound</p>`;
  await transport().sendMail({ from: "Fanbound <no-reply@fanbound.invalid>", to: p.to, subject: p.subject, text, html });
}

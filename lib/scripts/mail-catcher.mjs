// The local stand-in for a mail service: accepts SMTP on loopback and keeps
// each message as a JSON file in MAIL_DIR, newest last. Nothing is relayed.
//
// It also shows what it caught, read-only, on its own loopback port
// (MAIL_VIEW_PORT): a list at /, one message at /m/<id>, and the list as JSON
// at /messages.json. The app itself never serves captured mail: whoever can
// reach this port is on this machine.
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import { mkdirSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import http from "node:http";
import path from "node:path";

const port = Number(process.env.MAIL_PORT ?? 2525);
const viewPort = Number(process.env.MAIL_VIEW_PORT ?? port + 100);
const dir = process.env.MAIL_DIR ?? ".data/mail";
mkdirSync(dir, { recursive: true });

/** Most messages the list shows, newest first. */
const LIST_LIMIT = 200;

const esc = (s) =>
  String(s).replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]);

/** Plain text with its http(s) links made clickable; everything else escaped. */
function linked(text) {
  return String(text)
    .split(/(https?:\/\/[^\s<>"']+)/g)
    .map((part) => (/^https?:\/\//.test(part) ? `<a href="${esc(part)}">${esc(part)}</a>` : esc(part)))
    .join("");
}

function messages() {
  let files;
  try {
    files = readdirSync(dir).filter((f) => f.endsWith(".json")).sort().reverse().slice(0, LIST_LIMIT);
  } catch {
    return [];
  }
  const out = [];
  for (const f of files) {
    try {
      out.push(JSON.parse(readFileSync(path.join(dir, f), "utf8")));
    } catch {
      // A file still being written shows on the next visit.
    }
  }
  return out;
}

function message(id) {
  if (!/^[\w-]{1,64}$/.test(id)) return null;
  try {
    return JSON.parse(readFileSync(path.join(dir, `${id}.json`), "utf8"));
  } catch {
    return null;
  }
}

const STYLE = `body{font:15px/1.5 system-ui,sans-serif;background:#f6f4ee;color:#1d2430;margin:0}
main{max-width:60rem;margin:0 auto;padding:2rem 1rem}h1{font-size:1.4rem;margin:0 0 .25rem}
p.note{color:#5b6270;margin:0 0 1.5rem}table{width:100%;border-collapse:collapse}
th,td{text-align:left;padding:.4rem .6rem;border-bottom:1px solid #d9d4c7;vertical-align:top}
th{color:#5b6270;font-weight:600}a{color:#0f7b6c}td.t,code{font-family:ui-monospace,monospace;font-size:.85rem}
pre{white-space:pre-wrap;background:#fffdf8;border:1px solid #d9d4c7;padding:1rem;border-radius:4px}
dl{display:grid;grid-template-columns:max-content 1fr;gap:.2rem 1rem}dt{color:#5b6270}dd{margin:0}`;

function page(title, body) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title>
<meta name="viewport" content="width=device-width,initial-scale=1"><style>${STYLE}</style></head>
<body><main>${body}</main></body></html>`;
}

function listPage() {
  const list = messages();
  const rows = list
    .map(
      (m) => `<tr><td class="t">${esc(String(m.receivedAt).replace("T", " ").slice(0, 19))}</td>
<td><code>${esc((m.to ?? []).join(", "))}</code></td><td><a href="/m/${esc(m.id)}">${esc(m.subject || "(no subject)")}</a></td></tr>`,
    )
    .join("");
  return page(
    "Captured mail",
    `<h1>Captured mail</h1><p class="note">What the local mail catcher received, newest first (at most ${LIST_LIMIT}).
Nothing here left this machine. Reload for new messages.</p>
${list.length ? `<table><thead><tr><th>Received (UTC)</th><th>To</th><th>Subject</th></tr></thead><tbody>${rows}</tbody></table>` : "<p>No mail yet.</p>"}`,
  );
}

function messagePage(m) {
  return page(
    m.subject || "(no subject)",
    `<p><a href="/">← all captured mail</a></p><h1>${esc(m.subject || "(no subject)")}</h1>
<dl><dt>From</dt><dd>${esc(m.from)}</dd><dt>To</dt><dd><code>${esc((m.to ?? []).join(", "))}</code></dd>
<dt>Received</dt><dd>${esc(m.receivedAt)}</dd></dl><pre>${linked(m.text)}</pre>`,
  );
}

const HEADERS = {
  "cache-control": "no-store",
  "x-content-type-options": "nosniff",
  "referrer-policy": "no-referrer",
  "x-frame-options": "DENY",
  "content-security-policy": "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'",
};

// Only requests addressed to this machine by name or number: a web page that
// points a domain of its own at 127.0.0.1 (DNS rebinding) gets 421, not the mail.
const HOSTS = new Set([`127.0.0.1:${viewPort}`, `localhost:${viewPort}`, `[::1]:${viewPort}`]);

const view = http.createServer((req, res) => {
  const send = (status, type, body) => {
    res.writeHead(status, { ...HEADERS, "content-type": type });
    res.end(req.method === "HEAD" ? undefined : body);
  };
  if (!HOSTS.has(String(req.headers.host ?? "").toLowerCase())) return send(421, "text/plain; charset=utf-8", "Open this page as 127.0.0.1.\n");
  if (req.method !== "GET" && req.method !== "HEAD") {
    res.setHeader("allow", "GET, HEAD");
    return send(405, "text/plain; charset=utf-8", "Captured mail is read-only.\n");
  }
  const url = new URL(req.url ?? "/", "http://127.0.0.1");
  if (url.pathname === "/") return send(200, "text/html; charset=utf-8", listPage());
  if (url.pathname === "/messages.json") return send(200, "application/json", JSON.stringify(messages()));
  const m = /^\/m\/([^/]+)$/.exec(url.pathname);
  const found = m ? message(decodeURIComponent(m[1])) : null;
  if (found) return send(200, "text/html; charset=utf-8", messagePage(found));
  return send(404, "text/html; charset=utf-8", page("Not here", `<p>No such message. <a href="/">All captured mail</a></p>`));
});

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

for (const s of [server, view]) s.on("error", (e) => console.error(`mail catcher: ${e.message}`));
// The page opens first: the scripts take an open SMTP port to mean both are up.
view.listen(viewPort, "127.0.0.1", () => {
  server.listen(port, "127.0.0.1", () => {
    console.log(`mail catcher: SMTP on 127.0.0.1:${port}, page on http://127.0.0.1:${viewPort}/, messages kept in ${dir}`);
  });
});
for (const sig of ["SIGTERM", "SIGINT"]) process.on(sig, () => server.close(() => view.close(() => process.exit(0))));

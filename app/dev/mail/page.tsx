import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { SiteHeader } from "@/components/ui/SiteHeader";

export const metadata: Metadata = { title: "Captured mail" };
export const dynamic = "force-dynamic";

interface Captured {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
}

/** Newest first, at most 50: what the local mail catcher kept in MAIL_DIR. */
async function messages(dir: string): Promise<Captured[]> {
  let files: string[];
  try {
    files = (await readdir(dir)).filter((f) => f.endsWith(".json")).sort().reverse().slice(0, 50);
  } catch {
    return [];
  }
  const out: Captured[] = [];
  for (const f of files) {
    try {
      out.push(JSON.parse(await readFile(path.join(dir, f), "utf8")));
    } catch {
      // A file still being written is skipped until the next visit.
    }
  }
  return out;
}

/** Text with its http(s) links made clickable. */
function Linked({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"]+)/g);
  return (
    <>
      {parts.map((p, i) =>
        /^https?:\/\//.test(p) ? (
          <a key={i} href={p} className="break-all text-accent underline">{p}</a>
        ) : (
          <span key={i}>{p}</span>
        ),
      )}
    </>
  );
}

// Only where the local mail catcher runs (npm start / npm test set FANBOUND_MAIL_CATCHER=1); a real deployment answers 404.
export default async function CapturedMail() {
  const dir = process.env.MAIL_DIR;
  if (process.env.FANBOUND_MAIL_CATCHER !== "1" || !dir) notFound();
  const list = await messages(dir);
  return (
    <>
      <SiteHeader />
      <main className="mx-auto max-w-4xl px-4 py-10">
        <h1 className="text-2xl font-semibold">Captured mail</h1>
        <p className="mt-1 text-sm text-graphite">
          Messages the local mail catcher received, newest first. Nothing here left this machine.
        </p>
        {list.length === 0 ? (
          <p className="mt-8 rounded border border-rule bg-sheet px-4 py-6 text-graphite">No mail yet. Ask for a sign-in link or a password reset, then reload.</p>
        ) : (
          <ul className="mt-6 space-y-4">
            {list.map((m) => (
              <li key={m.id} className="rounded border border-rule bg-sheet p-4 shadow-sm">
                <div className="flex flex-wrap items-baseline justify-between gap-2">
                  <h2 className="font-semibold">{m.subject || "(no subject)"}</h2>
                  <time className="font-mono text-xs text-graphite" dateTime={m.receivedAt}>{m.receivedAt.replace("T", " ").slice(0, 19)} UTC</time>
                </div>
                <p className="mt-1 text-sm text-graphite">to <span className="font-mono">{m.to.join(", ")}</span></p>
                <pre className="mt-3 whitespace-pre-wrap font-sans text-sm text-ink"><Linked text={m.text} /></pre>
              </li>
            ))}
          </ul>
        )}
      </main>
    </>
  );
}

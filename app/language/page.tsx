import { readFile } from "node:fs/promises";
import path from "node:path";
import type { Metadata } from "next";
import { Marked } from "marked";
import { SiteHeader } from "@/components/ui/SiteHeader";
import { highlightToHtml } from "@/lib/lang/highlight";
import { TryIt } from "./_components/TryIt";

export const metadata: Metadata = {
  title: "Equation language",
  description: "Reference of the Fanbound equation language: inputs, outputs, operators, minterm lists, let, never, blocks.",
};

// Fanbound examples are coloured by the language's own lexer; other code stays plain.
const markdown = new Marked({
  gfm: true,
  renderer: {
    code({ text, lang }) {
      if (lang !== "fanbound") return false;
      return `<pre><code class="language-fanbound">${highlightToHtml(text)}</code></pre>\n`;
    },
  },
});

/** The language reference, written once in lib/lang/REFERENCE.md. */
export default async function LanguagePage() {
  const source = await readFile(path.join(process.cwd(), "lib/lang/REFERENCE.md"), "utf8");
  const html = await markdown.parse(source);
  return (
    <>
      <SiteHeader />
      <main className="page-frame grid gap-10 py-10 lg:grid-cols-[minmax(0,1fr)_24rem]">
        {/* the Markdown is ours, from the repository, so it is rendered as is */}
        <article className="doc" dangerouslySetInnerHTML={{ __html: html }} />
        <aside className="lg:sticky lg:top-4 lg:self-start">
          <TryIt />
        </aside>
      </main>
    </>
  );
}

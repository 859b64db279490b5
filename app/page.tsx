import Link from "next/link";
import { SiteHeader } from "@/components/ui/SiteHeader";

const stages = [
  ["Write", "Equations in the Fanbound language: inputs, outputs, minterm sets, impossible combinations, blocks."],
  ["Minimize", "Quine–McCluskey primes, then an exact cover; beyond exact reach a published heuristic with a proven lower bound."],
  ["Map", "Gates of the chosen family, never wider than its fan-in, with buffers wherever a net exceeds its fan-out."],
  ["Analyse", "Gate and package counts, depth, critical path, power, loads and level compatibility — as estimates."],
  ["Verify", "The netlist is proved equal to the specification: exhaustively, or by a SAT solver on wide functions."],
  ["Review", "Every save is a revision with its figures; reviewers compare, approve or ask for changes."],
] as const;

const example = `// Ferrow Lock & Weir — upper gate permit
inputs upper_shut, lower_shut, level_equal, stop
outputs open_upper

open_upper = level_equal * lower_shut * !stop`;

export default function Landing() {
  return (
    <>
      <SiteHeader>
        <Link href="/signin" className="rounded border border-accent px-3 py-1 text-accent hover:bg-accent hover:text-paper">
          Sign in
        </Link>
      </SiteHeader>
      <main>
        <section className="sheet-grid border-b border-rule">
          <div className="page-frame grid gap-10 py-16 md:grid-cols-[1.1fr_1fr]">
            <div>
              <h1 className="text-4xl font-bold leading-tight tracking-tight">
                From the conditions in a specification
                <br />
                to gates a logic family can build.
              </h1>
              <p className="mt-5 max-w-xl text-lg text-graphite">
                Fanbound minimizes your Boolean equations exactly, maps them onto the family you build with — within its
                fan-in and fan-out — and shows the gate count, depth, delay and power of the result, proved equal to what
                you wrote.
              </p>
              <div className="mt-8 flex gap-3">
                <Link href="/signin" className="rounded bg-accent px-4 py-2 font-semibold text-paper hover:opacity-90">
                  Sign in to your workspace
                </Link>
                <Link href="/language" className="rounded border border-rule bg-sheet px-4 py-2 hover:border-ink">
                  Read the language
                </Link>
              </div>
            </div>
            <figure className="self-center rounded border border-rule bg-sheet shadow-sm">
              <figcaption className="border-b border-rule px-4 py-2 text-xs uppercase tracking-wide text-graphite">
                chamber_interlock.fnb
              </figcaption>
              <pre className="overflow-x-auto px-4 py-4 font-mono text-sm leading-6">{example}</pre>
            </figure>
          </div>
        </section>
        <section className="page-frame py-12">
          <h2 className="mb-6 text-sm font-semibold uppercase tracking-wide text-graphite">The pipeline</h2>
          <ol className="grid gap-px overflow-hidden rounded border border-rule bg-rule sm:grid-cols-2 lg:grid-cols-3">
            {stages.map(([name, text], i) => (
              <li key={name} className="bg-sheet p-5">
                <div className="font-mono text-xs text-accent">{String(i + 1).padStart(2, "0")}</div>
                <div className="mt-1 font-semibold">{name}</div>
                <p className="mt-1 text-sm text-graphite">{text}</p>
              </li>
            ))}
          </ol>
          <p className="mt-8 max-w-3xl text-sm text-graphite">
            Delay, power, loading and level figures are estimates from each family&apos;s typical data. Check the data
            sheets of the parts you use and your own design rules before you build.
          </p>
        </section>
      </main>
    </>
  );
}

"use client";
import { memo, useState } from "react";
import type { MinimizeResult } from "./types";
import { cubeToString } from "@/lib/logic";

/** Longer equations are shown cut at a term boundary; the whole text can be copied. */
export const EXPRESSION_SHOWN_CHARS = 4_000;
/** Cubes listed per output when the list is opened. */
export const CUBES_SHOWN = 500;

/** The minimized equation of each output, with how sure we are of its optimality. */
function MinimizedPanelView({ covers }: { covers: MinimizeResult }) {
  const n = covers.inputs.length;
  const gap = covers.cost - covers.lowerBound;
  return (
    <div data-testid="minimized">
      <div className="mb-3 flex flex-wrap items-center gap-3 text-sm">
        {covers.exact ? (
          <span className="rounded-full bg-accent/15 px-2 py-0.5 text-accent" title="proven minimum under the cost model">
            exact minimum
          </span>
        ) : (
          <span className="rounded-full bg-amber/15 px-2 py-0.5 text-amber"
            title="prime and irredundant cover from the heuristic; the bound is proven">
            heuristic · cost {covers.cost}, proven bound {covers.lowerBound}
            {gap > 0 ? ` (at most ${gap} above optimum)` : " (meets the bound)"}
          </span>
        )}
        <span className="text-graphite">
          {covers.primes >= 0 ? `${covers.primes} prime implicants · ` : ""}
          {covers.shared} shared term{covers.shared === 1 ? "" : "s"} · {Math.round(covers.ms)} ms
        </span>
      </div>
      <ul className="space-y-3">
        {covers.outputs.map((o) => (
          <li key={o.name} className="rounded border border-rule bg-paper px-3 py-2" data-output={o.name}>
            <div className="flex flex-wrap items-baseline gap-x-3">
              <span className="min-w-0 break-words font-mono text-sm">
                <span className="font-semibold">{o.name}</span> = <Expression text={o.expression} terms={o.products} />
              </span>
              <span className="ml-auto text-xs text-graphite tabular">
                {o.form.toUpperCase()} · {o.products} {o.form === "sop" ? "products" : "sums"} · {o.literals} literals
                {!covers.exact && o.exact ? " · exact" : ""}
              </span>
            </div>
            {o.cubes.length > 0 && <CubeList cubes={o.cubes} n={n} inputs={covers.inputs} />}
          </li>
        ))}
      </ul>
    </div>
  );
}

/** The equation, cut at a term boundary when it is long, with a way to copy all of it. */
function Expression({ text, terms }: { text: string; terms: number }) {
  const [copied, setCopied] = useState(false);
  if (text.length <= EXPRESSION_SHOWN_CHARS) return <span data-testid="expression">{text}</span>;
  // SOP terms are joined by " + ", POS sums (in parentheses) by " * ".
  const pos = text.startsWith("(");
  const sep = pos ? " * " : " + ";
  const at = pos ? text.lastIndexOf(") * (", EXPRESSION_SHOWN_CHARS) + 1 : text.lastIndexOf(" + ", EXPRESSION_SHOWN_CHARS);
  const head = text.slice(0, at > 0 ? at : EXPRESSION_SHOWN_CHARS);
  const shown = head.split(sep).length;
  return (
    <>
      <span data-testid="expression">{head}</span>
      <span className="text-graphite">{sep}… ({terms - shown} more of {terms} terms) </span>
      <button type="button" className="rounded border border-rule px-1.5 text-xs hover:border-ink"
        onClick={() => void navigator.clipboard.writeText(text).then(() => setCopied(true), () => setCopied(false))}>
        {copied ? "copied" : "copy all"}
      </button>
    </>
  );
}

/** The output's cubes, listed only once the list is opened, at most CUBES_SHOWN of them. */
function CubeList({ cubes, n, inputs }: { cubes: MinimizeResult["outputs"][number]["cubes"]; n: number; inputs: string[] }) {
  const [open, setOpen] = useState(false);
  return (
    <details className="mt-1 text-xs text-graphite" onToggle={(e) => setOpen((e.target as HTMLDetailsElement).open)}>
      <summary className="cursor-pointer select-none">{cubes.length} cube{cubes.length === 1 ? "" : "s"} over {inputs.join(", ")}</summary>
      {open && (
        <div className="mt-1 flex flex-wrap gap-x-4 font-mono">
          {cubes.slice(0, CUBES_SHOWN).map((c, i) => (
            <span key={i}>{cubeToString(c, n)}</span>
          ))}
          {cubes.length > CUBES_SHOWN && <span>… and {cubes.length - CUBES_SHOWN} more</span>}
        </div>
      )}
    </details>
  );
}

/** Drawn again only when its own inputs change, not at every keystroke in the editor. */
export const MinimizedPanel = memo(MinimizedPanelView);

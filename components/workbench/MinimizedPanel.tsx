"use client";
import type { MinimizeResult } from "./types";
import { cubeToString } from "@/lib/logic";

/** The minimized equation of each output, with how sure we are of its optimality. */
export function MinimizedPanel({ covers }: { covers: MinimizeResult }) {
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
              <span className="font-mono text-sm">
                <span className="font-semibold">{o.name}</span> = <span data-testid="expression">{o.expression}</span>
              </span>
              <span className="ml-auto text-xs text-graphite tabular">
                {o.form.toUpperCase()} · {o.products} {o.form === "sop" ? "products" : "sums"} · {o.literals} literals
                {!covers.exact && o.exact ? " · exact" : ""}
              </span>
            </div>
            {o.cubes.length > 0 && (
              <details className="mt-1 text-xs text-graphite">
                <summary className="cursor-pointer select-none">cubes over {covers.inputs.join(", ")}</summary>
                <div className="mt-1 flex flex-wrap gap-x-4 font-mono">
                  {o.cubes.map((c, i) => (
                    <span key={i}>{cubeToString(c, n)}</span>
                  ))}
                </div>
              </details>
            )}
          </li>
        ))}
      </ul>
    </div>
  );
}

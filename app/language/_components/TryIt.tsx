"use client";
/** A small live editor on the reference page: type equations, see the checker's messages and the minterms. */
import dynamic from "next/dynamic";
import { useMemo, useState } from "react";
import { compileSource } from "../../../lib/lang/index";
import { tableFromCubes, tableMinterms, TRUTH_TABLE_MAX_INPUTS } from "../../../lib/logic/index";

const EquationEditor = dynamic(() => import("../../../components/editor/EquationEditor"), { ssr: false });

const START = `// Ferrow Lock & Weir: upper gate permit and alarm
inputs lower_shut, level_upper, override_key, estop
outputs open_upper, alarm

open_upper = estop' * lower_shut * (level_upper + override_key)
alarm = estop + override_key * lower_shut'
`;

export function TryIt() {
  const [source, setSource] = useState(START);
  const result = useMemo(() => compileSource(source), [source]);
  const spec = result.spec;
  const n = spec?.inputs.length ?? 0;
  return (
    <section aria-labelledby="try-it" className="mb-10">
      <h2 id="try-it" className="mb-2 text-sm font-semibold uppercase tracking-wide text-graphite">
        Try it
      </h2>
      <EquationEditor value={source} onChange={setSource} diagnostics={result.diagnostics} height="13rem" />
      <div className="mt-2 font-mono text-xs" aria-live="polite">
        {result.diagnostics.length === 0 ? (
          <p className="text-accent">No messages.</p>
        ) : (
          <ul>
            {result.diagnostics.map((d, i) => (
              <li key={i} className={d.severity === "error" ? "text-vermilion" : "text-amber"}>
                {d.line}:{d.column} {d.severity}: {d.message}
              </li>
            ))}
          </ul>
        )}
        {spec && n <= TRUTH_TABLE_MAX_INPUTS ? (
          <table className="mt-2 border-collapse">
            <tbody>
              {spec.outputs.map((o) => (
                <tr key={o.name} className="border-t border-rule">
                  <th className="py-1 pr-4 text-left font-semibold">{o.name}</th>
                  <td className="py-1 pr-4 text-graphite">on</td>
                  <td className="py-1 pr-6 tabular">{tableMinterms(tableFromCubes(o.on, n), n).join(" ") || "none"}</td>
                  <td className="py-1 pr-4 text-graphite">dc</td>
                  <td className="py-1 tabular">{tableMinterms(tableFromCubes(o.dc, n), n).join(" ") || "none"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : null}
      </div>
    </section>
  );
}

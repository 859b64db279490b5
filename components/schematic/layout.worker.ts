/// <reference lib="webworker" />
/**
 * Lays a netlist out off the page's main thread: the layered layout of a few
 * hundred gates takes seconds, which on the main thread would freeze the tab.
 * One request at a time; the page terminates the worker to cancel.
 */
import { layoutNetlist } from "@/lib/export/layout";
import type { Netlist } from "@/lib/map/netlist";

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = async (e: MessageEvent<{ id: number; netlist: Netlist }>) => {
  const { id, netlist } = e.data;
  try {
    const layout = await layoutNetlist(netlist);
    scope.postMessage({ id, ok: true, layout });
  } catch (err) {
    scope.postMessage({ id, ok: false, error: err instanceof Error ? err.message : String(err) });
  }
};

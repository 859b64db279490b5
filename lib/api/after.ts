import "server-only";
/**
 * Work a route does after it has answered: looking an address up, issuing a
 * secret and sending mail. A route that must answer the same, in the same
 * time, whether or not an address has an account hands all of that here, so
 * the answer cannot wait on (and so tell) which case it was.
 *
 * Inside a Next request the task runs through next/server's `after`, once the
 * response is sent; elsewhere (scripts, tests) on the next turn of the event
 * loop. A failing task is logged; the answer has gone already.
 */
import { after } from "next/server";

type Task = () => Promise<void>;

const g = globalThis as unknown as { fanboundAfter?: { pending: Set<Promise<void>>; hold: Task[] | null } };
const state = (g.fanboundAfter ??= { pending: new Set(), hold: null });

function run(task: Task): Promise<void> {
  const p: Promise<void> = task()
    .catch((e: unknown) => console.error("work after the response failed:", e))
    .finally(() => state.pending.delete(p));
  state.pending.add(p);
  return p;
}

/** Runs `task` after the response has been sent. */
export function afterResponse(task: Task): void {
  if (state.hold) {
    state.hold.push(task);
    return;
  }
  try {
    after(() => run(task));
  } catch {
    // Not inside a Next request (a test calling a handler, a script).
    setImmediate(() => void run(task));
  }
}

/** Waits until every task handed over so far has finished (tests). */
export async function settled(): Promise<void> {
  await new Promise((r) => setImmediate(r));
  while (state.pending.size) await Promise.all([...state.pending]);
}

/**
 * Holds every task handed over from now on instead of running it, so a test
 * can see what a request left for later; `release` runs them and stops holding.
 */
export function holdTasks(): { tasks: Task[]; release(): Promise<void> } {
  const tasks: Task[] = [];
  state.hold = tasks;
  return {
    tasks,
    async release() {
      state.hold = null;
      await Promise.all(tasks.map((t) => run(t)));
    },
  };
}

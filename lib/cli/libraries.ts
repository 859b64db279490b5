/**
 * Library blocks for the command line. A source's `use` lines are answered
 * from, in this order:
 *
 * 1. local folders given with `--library NAME=DIR` (repeatable): NAME is the
 *    library as the use line writes it, and DIR holds one file per block
 *    revision, DIR/BLOCK/N.fnb (N = 1, 2, …), each the block's source;
 * 2. the server, when FANBOUND_URL and FANBOUND_TOKEN are set (a personal API
 *    token): the workspace is FANBOUND_WORKSPACE, or the slug of a use line
 *    that writes "slug/key"; the server answers as its own compiles would.
 *
 * The answers are gathered before the compile, so the language core's
 * resolver answers synchronously.
 */
import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { findUses, requestKey, type LibraryAnswer, type LibraryResolver, type UseLine } from "../lang/index";
import { answerOfResolved, libraryFilePath, parseLibraryName, revisionOfFile, type ResolvedUse } from "../libraries/index";

export const LIBRARY_USAGE = "[--library NAME=DIR]...   (DIR/BLOCK/N.fnb: one file per block revision; or FANBOUND_URL and FANBOUND_TOKEN for the server's libraries)";

/** Takes the --library options out of the arguments; a string is what is wrong with them. */
export function takeLibraryOptions(args: string[]): { args: string[]; libraries: Map<string, string> } | string {
  const rest: string[] = [];
  const libraries = new Map<string, string>();
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (a !== "--library" && !a.startsWith("--library=")) {
      rest.push(a);
      continue;
    }
    const v = a === "--library" ? args[++i] : a.slice("--library=".length);
    const eq = v?.indexOf("=") ?? -1;
    if (!v || eq <= 0 || eq === v.length - 1) return `--library takes NAME=DIR (the library as use lines write it, and its folder), not ${v ?? "nothing"}`;
    const name = v.slice(0, eq);
    const dir = v.slice(eq + 1);
    if (!existsSync(dir) || !statSync(dir).isDirectory()) return `--library ${name}=${dir}: ${dir} is not a folder`;
    libraries.set(name, dir);
  }
  return { args: rest, libraries };
}

function revisionsIn(dir: string): number[] {
  return readdirSync(dir).map(revisionOfFile).filter((n): n is number => n !== null).sort((a, b) => a - b);
}

/** The answer for a use line from a local library folder. */
export function answerFromFolder(name: string, dir: string, u: { block: string; revision: number | null }): LibraryAnswer {
  const blockDir = path.join(dir, u.block);
  if (!existsSync(blockDir) || !statSync(blockDir).isDirectory()) {
    const blocks = readdirSync(dir).filter((f) => statSync(path.join(dir, f)).isDirectory() && revisionsIn(path.join(dir, f)).length > 0);
    return { ok: false, message: `library "${name}" (${dir}) has no block '${u.block}' (no folder ${blockDir}); ${blocks.length ? `its blocks are ${blocks.sort().join(", ")}` : "it holds no blocks: each is a folder BLOCK with files 1.fnb, 2.fnb, …"}` };
  }
  const revs = revisionsIn(blockDir);
  const latest = revs[revs.length - 1];
  if (latest === undefined) return { ok: false, message: `block '${u.block}' in ${blockDir} has no revisions: add files named 1.fnb, 2.fnb, …` };
  const n = u.revision ?? latest;
  if (!revs.includes(n)) {
    return { ok: false, message: `block '${u.block}' in "${name}" has no revision ${n} (no file ${path.join(dir, libraryFilePath(u.block, n))}); its revisions are ${revs.join(", ")} (write at ${latest} for the latest)` };
  }
  return { ok: true, source: readFileSync(path.join(dir, libraryFilePath(u.block, n)), "utf8"), revision: n, latest };
}

/** Asks the server to answer use lines, grouped by the workspace each is asked in. */
async function answersFromServer(uses: UseLine[], env: NodeJS.ProcessEnv, into: Map<string, LibraryAnswer>): Promise<void> {
  const url = env.FANBOUND_URL!.replace(/\/+$/, "");
  const groups = new Map<string, UseLine[]>();
  for (const u of uses) {
    const ws = env.FANBOUND_WORKSPACE || parseLibraryName(u.library)?.workspace;
    if (!ws) {
      into.set(requestKey(u), {
        ok: false,
        message: `set FANBOUND_WORKSPACE to the slug of the workspace whose library "${u.library}" is, or write the library as "WORKSPACE/${u.library}"`,
      });
      continue;
    }
    groups.set(ws, [...(groups.get(ws) ?? []), u]);
  }
  for (const [ws, list] of groups) {
    let items: ResolvedUse[];
    try {
      const res = await fetch(`${url}/api/v1/workspaces/${encodeURIComponent(ws)}/libraries/resolve`, {
        method: "POST",
        headers: { "content-type": "application/json", authorization: `Bearer ${env.FANBOUND_TOKEN}` },
        body: JSON.stringify({ uses: list.map((u) => ({ library: u.library, block: u.block, revision: u.revision })) }),
      });
      const body = (await res.json().catch(() => null)) as { items?: ResolvedUse[]; error?: { message?: string } } | null;
      if (!res.ok || !body?.items) throw new Error(body?.error?.message ?? `the server answered ${res.status}`);
      items = body.items;
    } catch (e) {
      const why = e instanceof Error ? e.message : String(e);
      for (const u of list) into.set(requestKey(u), { ok: false, message: `the server at ${url} could not answer for workspace ${ws}: ${why}` });
      continue;
    }
    list.forEach((u, i) => {
      into.set(requestKey(u), answerOfResolved(items[i], "the server gave no answer for this line"));
    });
  }
}

/**
 * The resolver for a source: answers gathered from the --library folders and,
 * for the rest, the server. Undefined when the source has no use lines.
 */
export async function libraryResolver(source: string, libraries: Map<string, string>, env: NodeJS.ProcessEnv = process.env): Promise<LibraryResolver | undefined> {
  const uses = findUses(source);
  if (uses.length === 0) return undefined;
  const answers = new Map<string, LibraryAnswer>();
  const remote: UseLine[] = [];
  for (const u of uses) {
    const dir = libraries.get(u.library);
    if (dir) answers.set(requestKey(u), answerFromFolder(u.library, dir, u));
    else remote.push(u);
  }
  if (remote.length > 0) {
    if (env.FANBOUND_URL && env.FANBOUND_TOKEN) {
      await answersFromServer(remote, env, answers);
    } else {
      const named = [...libraries.keys()];
      for (const u of remote) {
        answers.set(requestKey(u), {
          ok: false,
          message: `no library "${u.library}" here: give --library ${u.library}=DIR (a folder of DIR/BLOCK/N.fnb files), or set FANBOUND_URL and FANBOUND_TOKEN to use the server's libraries${named.length ? `; the folders given are for ${named.map((n) => `"${n}"`).join(", ")}` : ""}`,
        });
      }
    }
  }
  return (r) => answers.get(requestKey(r)) ?? { ok: false, message: `block '${r.block}' from "${r.library}" was not looked up` };
}

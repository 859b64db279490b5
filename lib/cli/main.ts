/**
 * The Fanbound command line: `npm run -s cli -- <command> [args]` or
 * `npx fanbound <command> [args]`, run from the bundle .build/cli.mjs (see
 * lib/cli/run.mjs). Each command lives in ./commands/<name>.ts and exports
 * `run(args: string[], io: CliIO): Promise<number>` returning the exit code;
 * the table below lists them, so the bundle holds every command (each in a
 * chunk of its own, loaded when it runs).
 */
import { readFileSync } from "node:fs";

export interface CliIO {
  /** Reads FILE, or standard input when FILE is "-". */
  readSource(file: string): string;
  out(text: string): void;
  err(text: string): void;
}

type Command = { run(args: string[], io: CliIO): Promise<number> };

/** Every command, each loaded when it runs (a check need not load the mapper, the SAT solver or the layout engine). */
const COMMANDS: Record<string, () => Promise<Command>> = {
  check: () => import("./commands/check"),
  table: () => import("./commands/table"),
  minimize: () => import("./commands/minimize"),
  map: () => import("./commands/map"),
  compare: () => import("./commands/compare"),
  families: () => import("./commands/families"),
  import: () => import("./commands/import"),
};

const io: CliIO = {
  readSource(file) {
    return file === "-" ? readFileSync(0, "utf8") : readFileSync(file, "utf8");
  },
  out(text) {
    process.stdout.write(text.endsWith("\n") ? text : text + "\n");
  },
  err(text) {
    process.stderr.write(text.endsWith("\n") ? text : text + "\n");
  },
};

async function main(argv: string[]): Promise<number> {
  const [name, ...args] = argv;
  const commands = Object.keys(COMMANDS);
  if (!name || name === "help" || name === "--help") {
    io.out(`usage: npm run -s cli -- <command> [args]\ncommands: ${commands.join(", ")}`);
    return name ? 0 : 2;
  }
  if (!commands.includes(name)) {
    io.err(`unknown command "${name}"; the commands are: ${commands.join(", ")}`);
    return 2;
  }
  const mod = await COMMANDS[name]!();
  try {
    return await mod.run(args, io);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "ENOENT") {
      io.err(`cannot read the file: ${(e as Error).message}`);
      return 2;
    }
    throw e;
  }
}

// Set the exit code and let Node drain stdout: process.exit() here would cut a
// piped write short (a pipe takes 64 KiB at a time).
main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    io.err(e instanceof Error ? (e.stack ?? e.message) : String(e));
    process.exitCode = 2;
  },
);

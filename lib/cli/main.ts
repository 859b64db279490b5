/**
 * The Fanbound command line: `npm run -s cli -- <command> [args]`.
 * Each command lives in ./commands/<name>.ts and exports
 * `run(args: string[], io: CliIO): Promise<number>` returning the exit code.
 */
import { readFileSync } from "node:fs";
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";
import path from "node:path";

export interface CliIO {
  /** Reads FILE, or standard input when FILE is "-". */
  readSource(file: string): string;
  out(text: string): void;
  err(text: string): void;
}

const here = path.dirname(fileURLToPath(import.meta.url));

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
  const commands = ["check", "table", "minimize", "map", "families", "import"].filter((c) =>
    existsSync(path.join(here, "commands", `${c}.ts`)),
  );
  if (!name || name === "help" || name === "--help") {
    io.out(`usage: npm run -s cli -- <command> [args]\ncommands: ${commands.join(", ")}`);
    return name ? 0 : 2;
  }
  if (!commands.includes(name)) {
    io.err(`unknown command "${name}"; the commands are: ${commands.join(", ")}`);
    return 2;
  }
  const mod = (await import(`./commands/${name}.ts`)) as {
    run(args: string[], io: CliIO): Promise<number>;
  };
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

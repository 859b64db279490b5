#!/usr/bin/env node
// The `fanbound` command (npm run -s cli, npx fanbound): runs the built CLI,
// building it first when it is missing or older than the sources.
import { ensureBuilt, outDir } from "../scripts/build.mjs";
import path from "node:path";
import { pathToFileURL } from "node:url";

await ensureBuilt();
await import(pathToFileURL(path.join(outDir, "cli.mjs")).href);

// Worker bootstrap: registers tsx's loader, then runs the TypeScript worker body.
import { register } from "tsx/esm/api";

register();
await import("./worker-thread.ts");

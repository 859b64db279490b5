import "server-only";
/**
 * Wraps a route implementation: authenticates, parses params, query and body
 * with the spec's zod schemas, runs it, and turns every failure into the one
 * error shape. Implementations read as guard-free business steps.
 */
import type { z } from "zod";
import { actorFromRequest, type Actor } from "../identity/actor";
import { findUnstorableText, readJsonBody, unstorableTextError } from "./body";
import { AppError, errorResponse, unauthenticated } from "./errors";
import { clientIp, enforceLimits } from "./rate-limit";
import type { RouteSpec } from "./registry";

type Out<T> = [T] extends [undefined] ? undefined : z.output<NonNullable<T> & z.ZodType>;

export interface RouteContext<S extends RouteSpec> {
  req: Request;
  actor: [S["auth"]] extends ["user"] ? Actor : Actor | null;
  params: Out<S["params"]>;
  query: Out<S["query"]>;
  body: Out<S["body"]>;
}

type NextContext = { params: Promise<Record<string, string | string[]>> };

function zodDetails(error: z.ZodError) {
  return error.issues.map((i) => ({ path: i.path.map(String).join("."), code: i.code, message: i.message }));
}

function parse<T extends z.ZodType | undefined>(schema: T, value: unknown, where: string): Out<T> {
  if (!schema) return undefined as Out<T>;
  const r = schema.safeParse(value);
  if (!r.success) {
    // Said as "field: what to change", e.g. "password: use at least 10 characters."; the details list every problem.
    const first = r.error.issues[0];
    const field = first && first.path.length ? first.path.map(String).join(".") : null;
    const what = (first?.message ?? "check the values").replace(/\.$/, "");
    const more = r.error.issues.length > 1 ? ` (and ${r.error.issues.length - 1} more problem${r.error.issues.length > 2 ? "s" : ""}, listed in the details)` : "";
    const message = field
      ? `${field}${where === "body" ? "" : ` (in the ${where === "path" ? "address" : where})`}: ${what}${more}.`
      : `The ${where === "path" ? "address" : where} is not valid: ${what}${more}.`;
    throw new AppError("invalid_input", message, zodDetails(r.error));
  }
  return r.data as Out<T>;
}

/** JSON success response with the given status (default 200). */
export function json(body: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(status === 204 ? null : JSON.stringify(body), {
    status,
    headers: { "content-type": "application/json", "cache-control": "no-store", ...headers },
  });
}

/**
 * A Next route handler for `spec`. The implementation returns a Response or a
 * plain value sent as JSON with spec.status (default 200).
 */
export function handle<S extends RouteSpec<z.ZodType | undefined, z.ZodType | undefined, z.ZodType | undefined, "user" | "none">>(spec: S, impl: (ctx: RouteContext<S>) => Promise<unknown>) {
  return async function routeHandler(req: Request, next?: NextContext): Promise<Response> {
    try {
      const actor = await actorFromRequest(req);
      if (spec.auth === "user" && !actor) throw unauthenticated();
      const rawParams = next?.params ? await next.params : {};
      const url = new URL(req.url);
      const rawQuery = Object.fromEntries(url.searchParams);
      const keys = [...url.searchParams.keys()];
      const twice = keys.find((k, i) => keys.indexOf(k) !== i);
      if (twice !== undefined) {
        throw new AppError("invalid_input", `The query names ${twice} more than once; give each parameter once.`, [{ path: twice, code: "duplicate", message: "given more than once" }]);
      }
      for (const [where, raw] of [["path", rawParams], ["query", rawQuery]] as const) {
        const bad = findUnstorableText(raw);
        if (bad) throw unstorableTextError(where, bad);
      }
      const params = parse(spec.params, rawParams, "path");
      const query = parse(spec.query, rawQuery, "query");
      const body = spec.body ? parse(spec.body, await readJsonBody(req, spec.maxBodyBytes), "body") : undefined;
      // Keyed on the parsed body: the address counted is the one the route acts on.
      const email = (body as { email?: unknown } | undefined)?.email;
      await enforceLimits(spec.limits, { caller: clientIp(req), userId: actor?.userId, email: typeof email === "string" ? email : null });
      const result = await impl({ req, actor, params, query, body } as RouteContext<S>);
      if (result instanceof Response) return result;
      return json(result, spec.status ?? 200);
    } catch (e) {
      return errorResponse(e);
    }
  };
}

/**
 * The OpenAPI 3.1 document of /api/v1, built from the route registry: the same
 * zod schemas the handlers validate with, turned into JSON Schema by zod.
 */
import { z } from "zod";
import { registry, type RouteSpec } from "./registry";
import { ErrorShape, routes } from "./routes";
import { LIMITS } from "./limits";

const STATUS_TEXT: Record<number, string> = {
  400: "Bad input: the details list each problem with its path",
  401: "Not signed in, or the API token is unknown, revoked or expired",
  403: "Your role does not allow this (or, for invitations, the address is not confirmed yet)",
  404: "Not found (also for records of workspaces you do not belong to)",
  409: "Conflicts with the current state",
  413: "Body over 256 KiB",
  415: "Body is not JSON",
  422: "The source has errors, a compile limit was reached, or an import was refused (details name it)",
  429: "Too many requests; see Retry-After",
};

function schema(s: z.ZodType, io: "input" | "output") {
  const out = z.toJSONSchema(s, { io, unrepresentable: "any" }) as Record<string, unknown>;
  delete out.$schema;
  return out;
}

function parameters(spec: RouteSpec) {
  const list: unknown[] = [];
  for (const [where, s] of [["path", spec.params], ["query", spec.query]] as const) {
    if (!s) continue;
    const js = schema(s, "input") as { properties?: Record<string, unknown>; required?: string[] };
    for (const [name, prop] of Object.entries(js.properties ?? {})) {
      list.push({ name, in: where, required: where === "path" || (js.required ?? []).includes(name), schema: prop });
    }
  }
  return list;
}

/** The whole document; `routes` is referenced so every spec module is loaded first. */
export function openApiDocument() {
  void routes;
  const paths: Record<string, Record<string, unknown>> = {};
  const error = { "application/json": { schema: schema(ErrorShape, "output") } };
  for (const spec of registry) {
    const op: Record<string, unknown> = {
      summary: spec.summary,
      tags: [spec.tag],
      operationId: `${spec.method.toLowerCase()}${spec.path.replace(/[{}]/g, "").replace(/[^A-Za-z0-9]+(.)?/g, (_m, c: string | undefined) => (c ?? "").toUpperCase())}`,
      parameters: parameters(spec),
      security: spec.auth === "user" ? [{ bearer: [] }, { session: [] }] : [],
      responses: {
        [String(spec.status ?? 200)]: spec.response
          ? { description: "Success", content: { "application/json": { schema: schema(spec.response, "output") } } }
          : { description: "The file", content: { [spec.produces ?? "application/octet-stream"]: { schema: { type: "string" } } } },
        ...Object.fromEntries(
          [...new Set(spec.errors)].sort().map((s) => [String(s), { description: STATUS_TEXT[s] ?? "Error", content: error }]),
        ),
      },
    };
    if (spec.limits?.length) {
      op["x-rate-limits"] = spec.limits.map((name) => ({ name, points: LIMITS[name].points, seconds: LIMITS[name].seconds, per: LIMITS[name].per }));
    }
    if (spec.body) op.requestBody = { required: true, content: { "application/json": { schema: schema(spec.body, "input") } } };
    (paths[spec.path] ??= {})[spec.method.toLowerCase()] = op;
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "Fanbound API",
      version: "1",
      description:
        "Workspaces, families, designs and revisions of Fanbound, and compilation of equations. Send a personal API token as `Authorization: Bearer <token>`; browsers use the session cookie. Errors have the shape {\"error\": {\"code\", \"message\", \"details\"}}.",
    },
    servers: [{ url: "/api/v1" }],
    components: {
      securitySchemes: {
        bearer: { type: "http", scheme: "bearer", description: "personal API token (fb_…)" },
        session: { type: "apiKey", in: "cookie", name: "next-auth.session-token" },
      },
    },
    paths,
  };
}

/**
 * Route specifications: method, path, schemas and summary of each REST route.
 * The handler wrapper validates with these very schemas and the OpenAPI
 * builder describes them, so the document cannot drift from the handlers.
 */
import type { z } from "zod";
import type { LimitName } from "./limits";

export type Method = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";

export interface RouteSpec<
  P extends z.ZodType | undefined = z.ZodType | undefined,
  Q extends z.ZodType | undefined = z.ZodType | undefined,
  B extends z.ZodType | undefined = z.ZodType | undefined,
  A extends "user" | "none" = "user" | "none",
> {
  method: Method;
  /** OpenAPI path below /api/v1, e.g. "/workspaces/{ws}". */
  path: string;
  summary: string;
  tag: string;
  /** "user": a signed-in caller is required (401 otherwise); "none": public. */
  auth: A;
  params?: P;
  query?: Q;
  body?: B;
  /** Response body on success; absent for file downloads. */
  response?: z.ZodType;
  /** Success status, default 200. */
  status?: number;
  /** Content type of a non-JSON success response. */
  produces?: string;
  /** Largest request body, in bytes; default MAX_BODY_BYTES (256 KiB). */
  maxBodyBytes?: number;
  /** Statuses this route may answer besides the success status. */
  errors: number[];
  /**
   * Rate limits the route is under (lib/api/limits.ts), counted by the handler
   * wrapper after the body is read and before the implementation runs.
   */
  limits?: readonly LimitName[];
}

export const registry: RouteSpec[] = [];

/** Records a route specification; the returned object is what the route handler wraps. */
export function defineRoute<
  P extends z.ZodType | undefined = undefined,
  Q extends z.ZodType | undefined = undefined,
  B extends z.ZodType | undefined = undefined,
  A extends "user" | "none" = "user" | "none",
>(spec: RouteSpec<P, Q, B, A>): RouteSpec<P, Q, B, A> {
  registry.push(spec as unknown as RouteSpec);
  return spec;
}

import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { limiters } from "@/lib/api/rate-limit";
import { compileDesign } from "@/lib/api/compile";
import { resolveCompileFamily } from "@/lib/data/families";

export const POST = handle(routes.compile, async ({ req, actor, body }) => {
  const { record, family } = await resolveCompileFamily({ actor, slug: body.workspace, familyId: body.familyId, familyKey: body.familyKey });
  limiters.compile.enforce(actor.userId, "compile");
  // A client that cancels (or goes away) stops the minimization with it.
  const outcome = await compileDesign(body.source, body.settings, family, { signal: req.signal });
  return { diagnostics: outcome.diagnostics, result: outcome.result, family: { id: record.id, key: record.key, name: record.name } };
});

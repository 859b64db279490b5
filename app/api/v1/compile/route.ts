import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { limiters } from "@/lib/api/rate-limit";
import { compileDesign } from "@/lib/api/compile";
import { resolveCompileFamily } from "@/lib/data/families";

export const POST = handle(routes.compile, async ({ actor, body }) => {
  const { record, family } = await resolveCompileFamily({ actor, slug: body.workspace, familyId: body.familyId, familyKey: body.familyKey });
  limiters.compile.enforce(actor.userId, "compile");
  const outcome = await compileDesign(body.source, body.settings, family);
  return { diagnostics: outcome.diagnostics, result: outcome.result, family: { id: record.id, key: record.key, name: record.name } };
});

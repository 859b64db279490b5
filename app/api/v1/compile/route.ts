import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { compileOnServer, libraryUseBody, resultBody } from "@/lib/runtime/compile";
import { resolveCompileFamily } from "@/lib/data/families";

export const POST = handle(routes.compile, async ({ req, actor, body }) => {
  const { record, family, workspaceId, boundary } = await resolveCompileFamily({
    actor, slug: body.workspace, familyId: body.familyId, familyKey: body.familyKey, settings: body.settings,
  });
  // A client that cancels (or goes away) stops the run with it.
  const out = await compileOnServer({
    source: body.source, family, settings: body.settings, userId: actor.userId, workspaceId, signal: req.signal, families: boundary,
  });
  return {
    diagnostics: out.diagnostics,
    libraries: out.libraryUses.map(libraryUseBody),
    result: out.result ? resultBody(out.result) : null,
    family: { id: record.id, key: record.key, name: record.name },
    cached: out.cached,
  };
});

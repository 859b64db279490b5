import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { createJob, listJobs } from "@/lib/data/jobs";

export const POST = handle(routes.createJob, async ({ actor, params, body }) => ({
  job: await createJob({ actor, slug: params.ws, ...body }),
}));
export const GET = handle(routes.listJobs, async ({ actor, params, query }) => ({
  items: await listJobs({ actor, slug: params.ws, mine: query.mine === "1", limit: query.limit }),
}));

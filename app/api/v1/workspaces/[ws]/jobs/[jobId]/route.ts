import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { cancelJob, getJob } from "@/lib/data/jobs";

export const GET = handle(routes.getJob, async ({ actor, params }) => ({ job: await getJob({ actor, slug: params.ws, jobId: params.jobId }) }));
export const DELETE = handle(routes.cancelJob, async ({ actor, params }) => ({ job: await cancelJob({ actor, slug: params.ws, jobId: params.jobId }) }));

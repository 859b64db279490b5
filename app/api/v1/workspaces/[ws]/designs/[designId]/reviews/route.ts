import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { listDesignReviews, requestReview } from "@/lib/data/reviews";

export const GET = handle(routes.listDesignReviews, async ({ actor, params }) => ({
  items: await listDesignReviews({ actor, slug: params.ws, designId: params.designId }),
}));
export const POST = handle(routes.requestReview, ({ actor, params, body }) =>
  requestReview({ actor, slug: params.ws, designId: params.designId, number: body.revision, reviewers: body.reviewers, message: body.message }),
);

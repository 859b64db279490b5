import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { withdrawReview } from "@/lib/data/reviews";

export const POST = handle(routes.withdrawReview, async ({ actor, params, body }) => ({
  review: await withdrawReview({ actor, slug: params.ws, reviewId: params.reviewId, note: body.note }),
}));

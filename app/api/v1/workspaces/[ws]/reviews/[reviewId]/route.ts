import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getReview } from "@/lib/data/reviews";

export const GET = handle(routes.getReview, async ({ actor, params }) => ({
  review: await getReview({ actor, slug: params.ws, reviewId: params.reviewId }),
}));

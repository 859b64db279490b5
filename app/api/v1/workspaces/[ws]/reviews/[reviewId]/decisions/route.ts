import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { decideReview } from "@/lib/data/reviews";

export const POST = handle(routes.decideReview, async ({ actor, params, body }) => ({
  review: await decideReview({ actor, slug: params.ws, reviewId: params.reviewId, verdict: body.verdict, note: body.note }),
}));

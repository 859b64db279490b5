import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { addComment } from "@/lib/data/reviews";

export const POST = handle(routes.addReviewComment, async ({ actor, params, body }) => ({
  review: await addComment({ actor, slug: params.ws, reviewId: params.reviewId, body: body.body, line: body.line ?? null }),
}));

import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { reviewInbox } from "@/lib/data/reviews";

export const GET = handle(routes.reviewInbox, ({ actor, params }) => reviewInbox({ actor, slug: params.ws }));

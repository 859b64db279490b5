import { handle } from "@/lib/api/handler";
import { routes } from "@/lib/api/routes";
import { getMe } from "@/lib/data/users";

export const GET = handle(routes.me, ({ actor }) => getMe({ actor }));

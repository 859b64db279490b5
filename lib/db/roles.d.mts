// Types of the parts of roles.mjs that TypeScript modules use (the benchmarks).
export const ROLES: { owner: string; app: string };
/** A connection URL for `role` on the server and database of `url`. */
export function urlForRole(url: string, role: string): string;

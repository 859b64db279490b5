// Types of the parts of services.mjs that TypeScript modules use (the benchmarks).
export const PORT_OFFSET: number;
export const PG_PORT: number;
export const profiles: Record<"dev" | "test", { database: string; smtpPort: number; webPort: number; mailDir: string }>;
/** The connection URL of a database on the project's PostgreSQL (or DATABASE_URL when set). */
export function databaseUrl(database: string): string;

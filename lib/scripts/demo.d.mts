import type { Role } from "../../models";
export declare const DEMO_PASSWORD: string;
export declare const DEMO_WORKSPACE: { name: string; slug: string };
export declare const DEMO_USERS: Array<[Role, string, string]>;
export declare const DEMO_ACCOUNTS: Array<[Role, string]>;

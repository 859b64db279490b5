// The demo workspace's sign-ins, printed by `npm start` and used by the seed and the browser tests.
export const DEMO_PASSWORD = "weir-keeper-2026";
export const DEMO_WORKSPACE = { name: "Ferrow controls", slug: "ferrow-controls" };
/** @type {Array<[import("../../models").Role, string, string]>} role, e-mail, name */
export const DEMO_USERS = [
  ["owner", "owner@ferrow.example", "Orla Ferrow"],
  ["designer", "designer@ferrow.example", "Dev Ashdown"],
  ["reviewer", "reviewer@ferrow.example", "Rhian Tull"],
  ["viewer", "viewer@ferrow.example", "Vik Marsh"],
];
export const DEMO_ACCOUNTS = DEMO_USERS.map(([role, email]) => [role, email]);

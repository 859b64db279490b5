/** Logic families: data model, built-in families, derived figures, compatibility, validation. */
export * from "./types";
export * from "./builtin";
export * from "./derive";
export * from "./compat";
export * from "./figures";
export * from "./validate";

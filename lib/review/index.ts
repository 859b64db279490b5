/**
 * What a reviewer compares: two sides' figures, their sources line by line
 * and their netlists by gate type and width. Pure: data in, data out; the web
 * app, the REST API and the CLI call the same functions.
 */
export * from "./figures";
export * from "./compare";
export * from "./source-diff";

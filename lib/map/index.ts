/** The mapper: covers → family gates → verified netlist. */
export * from "./netlist";
export * from "./trees";
export * from "./simulate";
export * from "./verification";
export * from "./mapper";
export * from "./network";

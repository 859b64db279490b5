/** Exporters: Verilog, VHDL, CSV, JSON and schematic layout data. */
export * from "./names";
export * from "./verilog";
export * from "./vhdl";
export * from "./csv";
export * from "./json";
export * from "./layout";

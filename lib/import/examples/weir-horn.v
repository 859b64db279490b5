// Ferrow Lock & Weir: weir keeper's horn and lamp, from the old relay board.
// Written for the board's simulation; one-bit signals, continuous assigns.
`timescale 1ns / 1ps
module weir_horn (
  input  wire sluice_open,   // sluice gate position switch
  input  wire pound_high,    // upstream level above the high mark
  input  wire flow,          // flow vane in the sluice culvert
  input  wire override_key,  // keeper's key: silences the horn
  output wire lamp,
  output wire horn
);
  wire blocked, leak, rising;
  assign blocked = sluice_open & ~flow;           /* open but nothing flows */
  assign leak    = ~sluice_open & flow;
  assign rising  = pound_high & ~sluice_open;
  assign lamp    = blocked | leak | rising;
  assign horn    = (blocked | rising & ~flow) & ~override_key;
endmodule

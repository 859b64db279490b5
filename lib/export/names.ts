/**
 * Legal identifiers for Verilog and VHDL. Names that are already legal are
 * kept; reserved words and other clashes become escaped (Verilog `\name `)
 * or extended (VHDL `\name\`) identifiers, which keep the user's spelling.
 */

// IEEE 1364-2005 keywords.
const VERILOG_KEYWORDS = new Set(
  ("always and assign automatic begin buf bufif0 bufif1 case casex casez cell cmos config deassign default defparam design " +
    "disable edge else end endcase endconfig endfunction endgenerate endmodule endprimitive endspecify endtable endtask event " +
    "for force forever fork function generate genvar highz0 highz1 if ifnone incdir include initial inout input instance integer " +
    "join large liblist library localparam macromodule medium module nand negedge nmos nor noshowcancelled not notif0 notif1 or " +
    "output parameter pmos posedge primitive pull0 pull1 pulldown pullup pulsestyle_onevent pulsestyle_ondetect rcmos real " +
    "realtime reg release repeat rnmos rpmos rtran rtranif0 rtranif1 scalared showcancelled signed small specify specparam " +
    "strong0 strong1 supply0 supply1 table task time tran tranif0 tranif1 tri tri0 tri1 triand trior trireg unsigned use uwire " +
    "vectored wait wand weak0 weak1 while wire wor xnor xor").split(" "),
);

// IEEE 1076-2008 reserved words, plus the names the generated architecture itself uses.
const VHDL_RESERVED = new Set(
  ("abs access after alias all and architecture array assert assume assume_guarantee attribute begin block body buffer bus " +
    "case component configuration constant context cover default disconnect downto else elsif end entity exit fairness file for " +
    "force function generate generic group guarded if impure in inertial inout is label library linkage literal loop map mod " +
    "nand new next nor not null of on open or others out package parameter port postponed procedure process property protected " +
    "pure range record register reject release rem report restrict restrict_guarantee return rol ror select sequence severity " +
    "shared signal sla sll sra srl strong subtype then to transport type unaffected units until use variable vmode vprop vunit " +
    "wait when while with xnor xor ieee std std_logic std_logic_1164 structure").split(" "),
);

/** Verilog identifier for a name: the name itself when legal, else an escaped identifier. */
export function verilogName(name: string): string {
  if (/^[A-Za-z_][A-Za-z0-9_$]*$/.test(name) && !VERILOG_KEYWORDS.has(name)) return name;
  return `\\${name.replace(/\s/g, "_")} `;
}

/**
 * A namer for one VHDL design unit: VHDL basic identifiers are
 * case-insensitive, so a second name differing only in case becomes an
 * extended identifier, as does any reserved word or illegal basic name.
 */
export function vhdlNamer(): (name: string) => string {
  const seen = new Map<string, string>();
  const taken = new Map<string, string>();
  return (name: string) => {
    const hit = seen.get(name);
    if (hit) return hit;
    const lower = name.toLowerCase();
    const basic = /^[A-Za-z](_?[A-Za-z0-9])*$/.test(name) && !VHDL_RESERVED.has(lower);
    let out: string;
    if (basic && !taken.has(lower)) {
      out = name;
      taken.set(lower, name);
    } else out = `\\${name.replace(/\\/g, "\\\\")}\\`;
    seen.set(name, out);
    return out;
  };
}

/** A unit name (module/entity) made from free text: letters, digits, single underscores, starting with a letter. */
export function unitName(text: string | undefined, fallback = "design_top"): string {
  const base = (text ?? "")
    .replace(/[^A-Za-z0-9]+/g, "_")
    .replace(/^_+|_+$/g, "")
    .replace(/^([0-9])/, "d_$1");
  const s = base || fallback;
  return VERILOG_KEYWORDS.has(s.toLowerCase()) || VHDL_RESERVED.has(s.toLowerCase()) ? `${s}_design` : s;
}

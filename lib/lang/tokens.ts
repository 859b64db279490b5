/**
 * Tokens of the Fanbound equation language and the chevrotain lexer.
 * Newlines are tokens (they end statements); spaces are skipped; comments go
 * to their own group so that the formatter can keep them.
 */
import { createToken, Lexer, type ILexerErrorMessageProvider, type TokenType } from "chevrotain";

export const Identifier = createToken({
  name: "Identifier",
  pattern: /[A-Za-z_][A-Za-z0-9_]*/,
  label: "a name",
});

function keyword(word: string): TokenType {
  return createToken({
    name: "Kw_" + word,
    pattern: new RegExp(word),
    longer_alt: Identifier,
    label: `'${word}'`,
  });
}

export const Inputs = keyword("inputs");
export const Outputs = keyword("outputs");
export const Let = keyword("let");
export const Never = keyword("never");
export const Block = keyword("block");
export const End = keyword("end");
export const Use = keyword("use");
export const From = keyword("from");
export const At = keyword("at");
export const On = keyword("on");
export const Off = keyword("off");
export const Dc = keyword("dc");

/** Every reserved word, in the order the reference lists them. */
export const KEYWORDS = [
  "inputs",
  "outputs",
  "on",
  "off",
  "dc",
  "let",
  "never",
  "block",
  "end",
  "use",
  "from",
  "at",
] as const;

export const Number_ = createToken({ name: "Number", pattern: /[0-9]+/, label: "a number" });
export const Str = createToken({ name: "String", pattern: /"[^"\n]*"/, label: "a quoted library path" });

export const Plus = createToken({ name: "Plus", pattern: /\+/, label: "'+'" });
export const Pipe = createToken({ name: "Pipe", pattern: /\|/, label: "'|'" });
export const Star = createToken({ name: "Star", pattern: /\*/, label: "'*'" });
export const Amp = createToken({ name: "Amp", pattern: /&/, label: "'&'" });
export const MidDot = createToken({ name: "MidDot", pattern: /\u00b7/, label: "'·'" });
export const Caret = createToken({ name: "Caret", pattern: /\^/, label: "'^'" });
export const Quote = createToken({ name: "Quote", pattern: /'/, label: "'''" });
export const Bang = createToken({ name: "Bang", pattern: /!/, label: "'!'" });
export const Tilde = createToken({ name: "Tilde", pattern: /~/, label: "'~'" });
export const Equals = createToken({ name: "Equals", pattern: /=/, label: "'='" });
export const Arrow = createToken({ name: "Arrow", pattern: /->/, label: "'->'" });
export const LParen = createToken({ name: "LParen", pattern: /\(/, label: "'('" });
export const RParen = createToken({ name: "RParen", pattern: /\)/, label: "')'" });
export const Comma = createToken({ name: "Comma", pattern: /,/, label: "','" });
export const DotDot = createToken({ name: "DotDot", pattern: /\.\./, label: "'..'" });
export const Newline = createToken({ name: "Newline", pattern: /\n/, label: "the end of the line" });
export const Comment = createToken({ name: "Comment", pattern: /\/\/[^\n]*/, group: "comments" });
export const Space = createToken({ name: "Space", pattern: /[ \t\r\f\v\u00a0]+/, group: Lexer.SKIPPED });

export const allTokens: TokenType[] = [
  Space,
  Comment,
  Newline,
  Inputs,
  Outputs,
  Let,
  Never,
  Block,
  End,
  Use,
  From,
  At,
  On,
  Off,
  Dc,
  Identifier,
  Number_,
  Str,
  Plus,
  Pipe,
  Star,
  Amp,
  MidDot,
  Caret,
  Quote,
  Bang,
  Tilde,
  Arrow,
  Equals,
  LParen,
  RParen,
  Comma,
  DotDot,
];

/**
 * A line that ends with one of these tokens continues on the next line, so
 * that long equations can be broken after an operator or a comma.
 */
export const CONTINUES_LINE: ReadonlySet<TokenType> = new Set([
  Plus,
  Pipe,
  Star,
  Amp,
  MidDot,
  Caret,
  Bang,
  Tilde,
  Equals,
  Arrow,
  LParen,
  Comma,
  DotDot,
]);

const lexerMessages: ILexerErrorMessageProvider = {
  buildUnexpectedCharactersMessage(fullText, startOffset, length) {
    const text = fullText.substr(startOffset, length);
    if (text.startsWith("/")) return "a single '/' is not allowed; comments start with //";
    if (text.startsWith("\"")) return "a quoted text must end on the same line with \"";
    if (text.startsWith(".")) return "a single '.' is not allowed; ranges of minterms are written 5..7";
    if (text.startsWith("-")) return "'-' is not an operator here; NOT is written a', !a or ~a, and block results follow ->";
    const shown = [...text].slice(0, 12).join("");
    return `unexpected character${[...text].length > 1 ? "s" : ""} '${shown}'; names use letters, digits and _`;
  },
  buildUnableToPopLexerModeMessage() {
    return "internal lexer mode error";
  },
};

export const lexer = new Lexer(allTokens, {
  positionTracking: "full",
  // only \n ends a line; a stray \r counts as a space, as in the Newline token
  lineTerminatorsPattern: /\n/g,
  lineTerminatorCharacters: ["\n"],
  errorMessageProvider: lexerMessages,
  ensureOptimizations: false,
});

/**
 * The grammar of one logical line (statement), free of semantics. The source
 * is split into logical lines before parsing (see parse.ts), so a mistake
 * stays inside its own line and produces one diagnostic.
 */
import { CstParser, EOF, type IParserErrorMessageProvider, type IToken, type TokenType } from "chevrotain";
import * as T from "./tokens";

function isKeyword(token: IToken): boolean {
  return token.tokenType.name.startsWith("Kw_");
}

/** Added to a message when a reserved word stands where a name belongs. */
function reservedHint(token: IToken): string {
  return isKeyword(token) ? ` ('${token.image}' is a reserved word and cannot be a name)` : "";
}

function describe(token: IToken): string {
  if (token.tokenType === EOF) return "the end of the line";
  if (token.tokenType === T.Identifier) return `'${token.image}'`;
  if (token.tokenType === T.Number_) return `the number ${token.image}`;
  return `'${token.image}'`;
}

function labelOf(t: TokenType): string {
  return t.LABEL ?? t.name;
}

const ruleHints: Record<string, string> = {
  atom: "a signal name, 0, 1, a block call or '('",
  unary: "a signal name, 0, 1, a block call or '('",
  postfix: "a signal name, 0, 1, a block call or '('",
  statement:
    "a statement: inputs, outputs, an equation such as f = a * b, let, never, block, end or use",
  rhs: "an expression or on(...), off(...), dc(...)",
  target: "a name or a list of names in parentheses",
  setClause: "on(...), off(...) or dc(...)",
  blockResults: "a result name or a list of result names in parentheses",
  nameList: "a name (several names are separated by commas)",
  indexItem: "a minterm number",
};

const messages: IParserErrorMessageProvider = {
  buildMismatchTokenMessage({ expected, actual }) {
    return `expected ${labelOf(expected)} but found ${describe(actual)}${expected === T.Identifier ? reservedHint(actual) : ""}`;
  },
  buildNotAllInputParsedMessage({ firstRedundant }) {
    if (firstRedundant.tokenType === T.Identifier || firstRedundant.tokenType === T.Number_ || firstRedundant.tokenType === T.LParen) {
      return `unexpected ${describe(firstRedundant)}: put an operator between terms (a * b for AND, a + b for OR) or start a new line`;
    }
    return `unexpected ${describe(firstRedundant)}: the statement is already complete here`;
  },
  buildNoViableAltMessage({ actual, ruleName }) {
    const first = actual[0]!;
    const hint = ruleName === "atom" || ruleName === "target" ? reservedHint(first) : "";
    return `expected ${ruleHints[ruleName] ?? "something else"} but found ${describe(first)}${hint}`;
  },
  buildEarlyExitMessage({ actual, ruleName }) {
    const first = actual[0]!;
    return `expected ${ruleHints[ruleName] ?? "something else"} but found ${describe(first)}`;
  },
};

export class LineParser extends CstParser {
  constructor() {
    super(T.allTokens, {
      recoveryEnabled: false,
      errorMessageProvider: messages,
      maxLookahead: 3,
      nodeLocationTracking: "full",
    });
    this.performSelfAnalysis();
  }

  public statement = this.RULE("statement", () => {
    this.OR([
      { ALT: () => this.SUBRULE(this.inputsDecl) },
      { ALT: () => this.SUBRULE(this.outputsDecl) },
      { ALT: () => this.SUBRULE(this.letStmt) },
      { ALT: () => this.SUBRULE(this.neverStmt) },
      { ALT: () => this.SUBRULE(this.blockHeader) },
      { ALT: () => this.SUBRULE(this.endStmt) },
      { ALT: () => this.SUBRULE(this.useStmt) },
      { ALT: () => this.SUBRULE(this.assignment) },
    ]);
  });

  private nameList = this.RULE("nameList", () => {
    this.AT_LEAST_ONE_SEP({ SEP: T.Comma, DEF: () => this.CONSUME(T.Identifier) });
  });

  private inputsDecl = this.RULE("inputsDecl", () => {
    this.CONSUME(T.Inputs);
    this.SUBRULE(this.nameList);
  });

  private outputsDecl = this.RULE("outputsDecl", () => {
    this.CONSUME(T.Outputs);
    this.SUBRULE(this.nameList);
  });

  private target = this.RULE("target", () => {
    this.OR([
      { ALT: () => this.CONSUME(T.Identifier) },
      {
        ALT: () => {
          this.CONSUME(T.LParen);
          this.SUBRULE(this.nameList);
          this.CONSUME(T.RParen);
        },
      },
    ]);
  });

  private letStmt = this.RULE("letStmt", () => {
    this.CONSUME(T.Let);
    this.SUBRULE(this.target);
    this.CONSUME(T.Equals);
    this.SUBRULE(this.rhs);
  });

  private assignment = this.RULE("assignment", () => {
    this.SUBRULE(this.target);
    this.CONSUME(T.Equals);
    this.SUBRULE(this.rhs);
  });

  private neverStmt = this.RULE("neverStmt", () => {
    this.CONSUME(T.Never);
    this.SUBRULE(this.expression);
  });

  private blockHeader = this.RULE("blockHeader", () => {
    this.CONSUME(T.Block);
    this.CONSUME(T.Identifier);
    this.CONSUME(T.LParen);
    this.OPTION(() => this.SUBRULE(this.nameList));
    this.CONSUME(T.RParen);
    this.CONSUME(T.Arrow);
    this.SUBRULE(this.blockResults);
  });

  private blockResults = this.RULE("blockResults", () => {
    this.OR([
      { ALT: () => this.CONSUME(T.Identifier) },
      {
        ALT: () => {
          this.CONSUME(T.LParen);
          this.SUBRULE(this.nameList);
          this.CONSUME(T.RParen);
        },
      },
    ]);
  });

  private endStmt = this.RULE("endStmt", () => {
    this.CONSUME(T.End);
  });

  private useStmt = this.RULE("useStmt", () => {
    this.CONSUME(T.Use);
    this.CONSUME(T.Identifier);
    this.CONSUME(T.From);
    this.CONSUME(T.Str);
    this.OPTION(() => {
      this.CONSUME(T.At);
      this.CONSUME(T.Number_);
    });
  });

  private rhs = this.RULE("rhs", () => {
    this.OR([
      { ALT: () => this.AT_LEAST_ONE(() => this.SUBRULE(this.setClause)) },
      {
        ALT: () => {
          this.SUBRULE(this.expression);
          this.OPTION2(() => this.SUBRULE2(this.setClause));
        },
      },
    ]);
  });

  private setClause = this.RULE("setClause", () => {
    this.OR([
      { ALT: () => this.CONSUME(T.On) },
      { ALT: () => this.CONSUME(T.Off) },
      { ALT: () => this.CONSUME(T.Dc) },
    ]);
    this.CONSUME(T.LParen);
    this.MANY_SEP({ SEP: T.Comma, DEF: () => this.SUBRULE(this.indexItem) });
    this.CONSUME(T.RParen);
  });

  private indexItem = this.RULE("indexItem", () => {
    this.CONSUME(T.Number_);
    this.OPTION(() => {
      this.CONSUME(T.DotDot);
      this.CONSUME2(T.Number_);
    });
  });

  public expression = this.RULE("expression", () => {
    this.SUBRULE(this.orExpr);
  });

  private orExpr = this.RULE("orExpr", () => {
    this.SUBRULE(this.xorExpr);
    this.MANY(() => {
      this.OR([{ ALT: () => this.CONSUME(T.Plus) }, { ALT: () => this.CONSUME(T.Pipe) }]);
      this.SUBRULE2(this.xorExpr);
    });
  });

  private xorExpr = this.RULE("xorExpr", () => {
    this.SUBRULE(this.andExpr);
    this.MANY(() => {
      this.CONSUME(T.Caret);
      this.SUBRULE2(this.andExpr);
    });
  });

  private andExpr = this.RULE("andExpr", () => {
    this.SUBRULE(this.unary);
    this.MANY(() => {
      this.OR([
        { ALT: () => this.CONSUME(T.Star) },
        { ALT: () => this.CONSUME(T.Amp) },
        { ALT: () => this.CONSUME(T.MidDot) },
      ]);
      this.SUBRULE2(this.unary);
    });
  });

  private unary = this.RULE("unary", () => {
    this.MANY(() => this.OR([{ ALT: () => this.CONSUME(T.Bang) }, { ALT: () => this.CONSUME(T.Tilde) }]));
    this.SUBRULE(this.postfix);
  });

  private postfix = this.RULE("postfix", () => {
    this.SUBRULE(this.atom);
    this.MANY(() => this.CONSUME(T.Quote));
  });

  private atom = this.RULE("atom", () => {
    this.OR([
      { ALT: () => this.CONSUME(T.Number_) },
      {
        ALT: () => {
          this.CONSUME(T.Identifier);
          this.OPTION(() => {
            this.CONSUME(T.LParen);
            this.MANY_SEP({ SEP: T.Comma, DEF: () => this.SUBRULE(this.expression) });
            this.CONSUME(T.RParen);
          });
        },
      },
      {
        ALT: () => {
          this.CONSUME2(T.LParen);
          this.SUBRULE2(this.expression);
          this.CONSUME2(T.RParen);
        },
      },
    ]);
  });
}

let shared: LineParser | null = null;

/** One parser instance for the process; chevrotain's self-analysis is the costly part. */
export function lineParser(): LineParser {
  shared ??= new LineParser();
  return shared;
}

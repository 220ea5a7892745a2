// Where a JSON text first goes wrong, as a line and column people can find in their editor. JSON.parse says where only
// for some errors (Node 20: "at position N" for some, nothing for an unexpected token), so jsonc-parser (VS Code's
// JSON scanner) locates it, with comments and trailing commas refused as JSON.parse refuses them.
import { parse, printParseErrorCode, type ParseError } from "jsonc-parser";

export type JsonErrorPlace = { line: number; column: number; message: string };

const EXPLANATIONS: Record<string, string> = {
  InvalidSymbol: "unexpected characters",
  InvalidNumberFormat: "a number written wrongly",
  PropertyNameExpected: "a property name in double quotes was expected",
  ValueExpected: "a value was expected",
  ColonExpected: "a colon was expected",
  CommaExpected: "a comma was expected",
  CloseBraceExpected: "a closing } was expected",
  CloseBracketExpected: "a closing ] was expected",
  EndOfFileExpected: "nothing more was expected",
  InvalidCommentToken: "comments are not allowed in JSON",
  UnexpectedEndOfComment: "comments are not allowed in JSON",
  UnexpectedEndOfString: "a string is not closed",
  UnexpectedEndOfNumber: "a number ends too early",
  InvalidUnicode: "a \\u escape is written wrongly",
  InvalidEscapeCharacter: "an escape character that JSON does not have",
  InvalidCharacter: "a control character inside a string",
};

/** The first syntax error of `text` (1-based line and column), or null when it is well-formed JSON. */
export function locateJsonError(text: string): JsonErrorPlace | null {
  const errors: ParseError[] = [];
  parse(text, errors, { disallowComments: true, allowTrailingComma: false, allowEmptyContent: false });
  const first = errors[0];
  if (!first) return null;
  const before = text.slice(0, first.offset);
  const line = before.split(/\r\n|\r|\n/).length;
  const column = first.offset - Math.max(before.lastIndexOf("\n"), before.lastIndexOf("\r")); // 1-based
  const code = printParseErrorCode(first.error);
  return { line, column, message: `line ${line}, column ${column}: ${EXPLANATIONS[code] ?? code}` };
}

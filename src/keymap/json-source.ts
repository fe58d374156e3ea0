import { parse, printParseErrorCode, visit, type ParseError } from 'jsonc-parser';

/** Where a problem sits in a JSON text, for messages that name the line. */
export function lineOf(text: string, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset && i < text.length; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}

/** Deeper than this is no keymap, and a parser that recurses would run out of stack. */
export const MAX_DEPTH = 64;

/** The line where nesting passes MAX_DEPTH, or null; strings are skipped. */
function tooDeep(text: string): number | null {
  let depth = 0;
  let line = 1;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10) line++;
    if (inString) {
      if (c === 92) i++;
      else if (c === 34) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 123 || c === 91) {
      if (++depth > MAX_DEPTH) return line;
    } else if (c === 125 || c === 93) depth--;
  }
  return null;
}

export interface DuplicateProperty {
  readonly path: readonly string[];
  readonly name: string;
  readonly firstLine: number;
  readonly line: number;
}

/**
 * Strict JSON parse that also reports repeated property names, which
 * JSON.parse silently resolves by keeping the last one.
 */
export function parseStrictJson(
  text: string,
): { ok: true; value: unknown; duplicates: DuplicateProperty[] } | { ok: false; message: string } {
  const deep = tooDeep(text);
  if (deep) return { ok: false, message: `line ${deep}: nested more than ${MAX_DEPTH} levels deep (a keymap is three levels deep)` };
  const errors: ParseError[] = [];
  const value: unknown = parse(text, errors, { disallowComments: true, allowTrailingComma: false });
  const first = errors[0];
  if (first) {
    return {
      ok: false,
      message: `line ${lineOf(text, first.offset)}: ${describeParseError(printParseErrorCode(first.error))} (the file must be plain JSON)`,
    };
  }
  const duplicates: DuplicateProperty[] = [];
  let protoLine: number | undefined;
  // One entry per open object or array: its property name (null in arrays and at the root)
  // and, for objects, the names seen so far.
  const open: { name: string | null; names: Map<string, number> | null }[] = [];
  let pendingName: string | null = null;
  const begin = (isObject: boolean) => {
    open.push({ name: pendingName, names: isObject ? new Map() : null });
    pendingName = null;
  };
  visit(
    text,
    {
      onObjectBegin: () => begin(true),
      onArrayBegin: () => begin(false),
      onObjectEnd: () => void open.pop(),
      onArrayEnd: () => void open.pop(),
      onObjectProperty: (name, _offset, _length, startLine) => {
        const names = open[open.length - 1]?.names;
        // The parser counts lines as it goes: counting them again per property would be quadratic.
        const line = startLine + 1;
        if (name === '__proto__') protoLine ??= line;
        const before = names?.get(name);
        if (before !== undefined) {
          const path = open.map((o) => o.name).filter((n): n is string => n !== null);
          duplicates.push({ path, name, firstLine: before, line });
        } else names?.set(name, line);
        pendingName = name;
      },
      onLiteralValue: () => {
        pendingName = null;
      },
    },
    { disallowComments: true },
  );
  // JSON.parse and the JSON parser would make "__proto__" the object's prototype, not a field: it would vanish without a word.
  if (protoLine !== undefined) return { ok: false, message: `line ${protoLine}: "__proto__" cannot be a name in a keymap` };
  return { ok: true, value, duplicates };
}

function describeParseError(code: string): string {
  const plain: Record<string, string> = {
    InvalidSymbol: 'unexpected character',
    InvalidNumberFormat: 'badly formed number',
    PropertyNameExpected: 'expected a quoted property name',
    ValueExpected: 'expected a value',
    ColonExpected: 'expected ":"',
    CommaExpected: 'expected ","',
    CloseBraceExpected: 'expected "}"',
    CloseBracketExpected: 'expected "]"',
    EndOfFileExpected: 'unexpected text after the end of the JSON value',
    InvalidCommentToken: 'comments are not allowed',
    UnexpectedEndOfComment: 'comments are not allowed',
    UnexpectedEndOfString: 'unterminated string',
    UnexpectedEndOfNumber: 'badly formed number',
    InvalidUnicode: 'invalid unicode escape',
    InvalidEscapeCharacter: 'invalid escape character',
    InvalidCharacter: 'invalid character in string',
  };
  return plain[code] ?? code;
}

/**
 * Reading a model file: JSON.parse, and when it fails, where. Node 20's parser gives a character position for
 * some errors ("… in JSON at position 18") and only an excerpt for others ("Unexpected token '}', …"), so the
 * position comes from the parser when it gives one and otherwise from a small scan of the JSON grammar
 * (RFC 8259) that stops at the first character that cannot continue the text.
 */

export type JsonInput =
  | { readonly ok: true; readonly value: unknown }
  | {
      readonly ok: false;
      /** 1-based, as editors count. */
      readonly line: number;
      readonly column: number;
      /** What the parser said, without its position or excerpt. */
      readonly reason: string;
      /** The offending line and a caret under the column. */
      readonly excerpt: string;
    };

const WHITE_SPACE = " \t\n\r";
const ESCAPES = '"\\/bfnrt';

function isDigit(c: string | undefined): boolean {
  return c !== undefined && c >= "0" && c <= "9";
}

/** Offset of the first character at which `text` stops being JSON, or -1 when it is JSON. */
export function firstJsonErrorOffset(text: string): number {
  let i = 0;
  const n = text.length;
  const skipSpace = () => {
    while (i < n && WHITE_SPACE.includes(text[i])) i++;
  };
  const string = (): boolean => {
    i++; // the opening quote
    while (i < n) {
      const c = text[i];
      if (c === '"') {
        i++;
        return true;
      }
      if (c < " ") return false;
      if (c === "\\") {
        const e = text[i + 1];
        i++; // a bad escape is placed at the character after the backslash, as the parser places it
        if (e === "u") {
          i++;
          for (let k = 0; k < 4; k++, i++) if (!/[0-9a-fA-F]/.test(text[i] ?? "")) return false;
          continue;
        }
        if (e === undefined || !ESCAPES.includes(e)) return false;
        i++;
        continue;
      }
      i++;
    }
    return false;
  };
  const value = (): boolean => {
    skipSpace();
    const c = text[i];
    if (c === "{") return members("}", true);
    if (c === "[") return members("]", false);
    if (c === '"') return string();
    for (const word of ["true", "false", "null"]) {
      if (c === word[0]) {
        for (const ch of word) {
          if (text[i] !== ch) return false;
          i++;
        }
        return true;
      }
    }
    if (c === "-" || isDigit(c)) return number();
    return false;
  };
  const digits = (): boolean => {
    if (!isDigit(text[i])) return false;
    while (isDigit(text[i])) i++;
    return true;
  };
  /** -? (0 | [1-9] digits) (. digits)? ([eE] [+-]? digits)?, stopping where it first fails. */
  const number = (): boolean => {
    if (text[i] === "-") i++;
    if (text[i] === "0") i++;
    else if (!digits()) return false;
    if (text[i] === ".") {
      i++;
      if (!digits()) return false;
    }
    if (text[i] === "e" || text[i] === "E") {
      i++;
      if (text[i] === "+" || text[i] === "-") i++;
      if (!digits()) return false;
    }
    return true;
  };
  /** An object's members or an array's elements, up to the closing bracket. */
  const members = (close: string, keyed: boolean): boolean => {
    i++;
    skipSpace();
    if (text[i] === close) {
      i++;
      return true;
    }
    for (;;) {
      if (keyed) {
        skipSpace();
        if (text[i] !== '"' || !string()) return false;
        skipSpace();
        if (text[i] !== ":") return false;
        i++;
      }
      if (!value()) return false;
      skipSpace();
      if (text[i] === ",") {
        i++;
        continue;
      }
      if (text[i] !== close) return false;
      i++;
      return true;
    }
  };
  try {
    if (!value()) return Math.min(i, n);
  } catch {
    return -1; // nested beyond the stack: no position to give
  }
  skipSpace();
  return i < n ? i : -1;
}

/** 1-based line and column of a character offset. */
export function lineAndColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text[i] === "\n") {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

/** The parser's message without the position and excerpt it appends. */
export function parserReason(message: string): string {
  const unexpected = /^(Unexpected token .+?), (?:\.\.\.)?"/s.exec(message);
  if (unexpected) return unexpected[1];
  return message
    .replace(/ in JSON at position \d+.*$/s, "")
    .replace(/ \(line \d+ column \d+\)$/, "")
    .trim();
}

function excerptAt(text: string, line: number, column: number): string {
  const source = text.split("\n")[line - 1]?.replace(/\r$/, "") ?? "";
  const shown = source.length > 100 ? source.slice(Math.max(0, column - 60), Math.max(0, column - 60) + 100) : source;
  const caretAt = source.length > 100 ? column - Math.max(0, column - 60) : column;
  return `  ${line} | ${shown}\n  ${" ".repeat(String(line).length)} | ${" ".repeat(Math.max(0, caretAt - 1))}^`;
}

export function parseJsonText(raw: string): JsonInput {
  const text = raw.charCodeAt(0) === 0xfeff ? raw.slice(1) : raw; // a byte-order mark is not part of the JSON
  try {
    return { ok: true, value: JSON.parse(text) };
  } catch (e) {
    const message = (e as Error).message;
    const stated = /at position (\d+)/.exec(message);
    const scanned = firstJsonErrorOffset(text);
    const offset = stated ? Number(stated[1]) : scanned >= 0 ? scanned : text.length;
    const { line, column } = lineAndColumn(text, offset);
    return { ok: false, line, column, reason: parserReason(message), excerpt: excerptAt(text, line, column) };
  }
}

// Where a text stops being JSON, as a line and column. JSON.parse says only "not valid JSON" on
// some engines (Node 20 among them) and words it differently on each, so a planner fixing a file
// by hand gets the place from this small scanner instead. It keeps its own stack rather than
// recursing, so a hostile file nested a million deep cannot overflow the call stack.

export interface JsonSyntaxError {
  /** 1-based line and column (column counted in characters). */
  line: number;
  column: number;
  message: string;
}

type Expect = "value" | "valueOrClose" | "key" | "keyOrClose" | "colon" | "commaOrClose" | "end";

const whitespace = new Set([" ", "\t", "\n", "\r"]);
const escapes = new Set(['"', "\\", "/", "b", "f", "n", "r", "t"]);
const hexDigit = /^[0-9a-fA-F]$/;

function position(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let lineStart = 0;
  for (let i = 0; i < offset; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      lineStart = i + 1;
    }
  }
  return { line, column: offset - lineStart + 1 };
}

function shown(char: string): string {
  if (char === "\n") return "a line break";
  if (char === "'") return "a single quote (JSON needs double quotes)";
  return `"${char}"`;
}

/** Length of the number starting at `start`, or 0 when there is none by JSON's grammar. */
function numberLength(text: string, start: number): number {
  const match = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;
  match.lastIndex = start;
  return match.exec(text) ? match.lastIndex - start : 0;
}

/** Finds the first syntax error, or null when the text is JSON. */
export function findJsonSyntaxError(text: string): JsonSyntaxError | null {
  const stack: ("{" | "[")[] = [];
  let expect: Expect = "value";
  let i = 0;
  const fail = (offset: number, message: string): JsonSyntaxError => ({ ...position(text, offset), message });
  const afterValue = (): Expect => (stack.length > 0 ? "commaOrClose" : "end");

  /** Scans a string starting at its opening quote; returns an error or moves `i` past it. */
  const scanString = (): JsonSyntaxError | null => {
    const open = i;
    i++;
    while (i < text.length) {
      const char = text[i];
      if (char === '"') {
        i++;
        return null;
      }
      if (char.charCodeAt(0) < 0x20)
        return fail(i, "a line break or control character inside a quoted text; close the quote or write \\n");
      if (char === "\\") {
        const next = text[i + 1];
        if (next === "u") {
          const hex = text.slice(i + 2, i + 6);
          if (hex.length < 4 || ![...hex].every((h) => hexDigit.test(h)))
            return fail(i, "\\u must be followed by four hexadecimal digits");
          i += 6;
          continue;
        }
        if (next === undefined || !escapes.has(next)) return fail(i, `"\\${next ?? ""}" is not a JSON escape`);
        i += 2;
        continue;
      }
      i++;
    }
    return fail(open, "a quoted text is never closed");
  };

  for (;;) {
    while (i < text.length && whitespace.has(text[i])) i++;
    if (i >= text.length) {
      if (expect === "end") return null;
      if (stack.length === 0) return fail(i, "the file holds no JSON value");
      return fail(i, `the file ends inside ${stack[stack.length - 1] === "{" ? "an object (a \"}\" is missing)" : "a list (a \"]\" is missing)"}`);
    }
    const char = text[i];
    switch (expect) {
      case "value":
      case "valueOrClose": {
        if (char === "]" && expect === "valueOrClose") {
          stack.pop();
          i++;
          expect = afterValue();
        } else if (char === "{") {
          stack.push("{");
          i++;
          expect = "keyOrClose";
        } else if (char === "[") {
          stack.push("[");
          i++;
          expect = "valueOrClose";
        } else if (char === '"') {
          const error = scanString();
          if (error) return error;
          expect = afterValue();
        } else if (text.startsWith("true", i) || text.startsWith("null", i)) {
          i += 4;
          expect = afterValue();
        } else if (text.startsWith("false", i)) {
          i += 5;
          expect = afterValue();
        } else {
          const length = numberLength(text, i);
          if (length === 0) {
            const trailingComma = char === "]" || char === "}";
            return fail(
              i,
              trailingComma
                ? `unexpected "${char}" after a comma (JSON allows no comma before a closing bracket)`
                : `unexpected ${shown(char)} where a value was expected`,
            );
          }
          i += length;
          expect = afterValue();
        }
        break;
      }
      case "key":
      case "keyOrClose": {
        if (char === "}" && expect === "keyOrClose") {
          stack.pop();
          i++;
          expect = afterValue();
        } else if (char === '"') {
          const error = scanString();
          if (error) return error;
          expect = "colon";
        } else if (char === "}") {
          return fail(i, 'unexpected "}" after a comma (JSON allows no comma before a closing bracket)');
        } else {
          return fail(i, `unexpected ${shown(char)}; a field name in double quotes was expected`);
        }
        break;
      }
      case "colon": {
        if (char !== ":") return fail(i, `unexpected ${shown(char)}; a ":" was expected after the field name`);
        i++;
        expect = "value";
        break;
      }
      case "commaOrClose": {
        const open = stack[stack.length - 1];
        const close = open === "{" ? "}" : "]";
        if (char === ",") {
          i++;
          expect = open === "{" ? "key" : "value";
        } else if (char === close) {
          stack.pop();
          i++;
          expect = afterValue();
        } else {
          return fail(i, `unexpected ${shown(char)}; a "," or "${close}" was expected (is a comma missing?)`);
        }
        break;
      }
      case "end":
        return fail(i, `unexpected ${shown(char)} after the end of the document`);
    }
  }
}

// Field readers for the single-pass validator: each reads one value of an untrusted document,
// records any issue at its path with the message the zod schema in `schema.ts` gives for it, and
// returns the value as the schema would output it. Kept to zod's rules where a planner can see
// them: type errors stop the cross-element rules, range and length errors do not; a string is
// trimmed before its length is counted (in code points); a list or text given where the other
// was expected still has its length checked.

export type PathPart = string | number;

export interface Issue {
  path: PathPart[];
  message: string;
}

/** Plain words for a value that has the wrong type. */
export function describeValue(value: unknown): string {
  if (value === null) return "null";
  if (Array.isArray(value)) return "a list";
  if (typeof value === "string") return `the text "${value.length > 20 ? `${value.slice(0, 20)}…` : value}"`;
  if (typeof value === "number" && !Number.isFinite(value)) return String(value);
  return typeof value;
}

/** The message for a value of the wrong type, as `schema.ts` words zod's. */
export function typeMessage(expected: string, input: unknown): string {
  if (input === undefined) return `is required (${expected})`;
  return `must be ${expected === "array" || expected === "object" ? "an" : "a"} ${expected}, not ${describeValue(input)}`;
}

export function isObject(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null && !Array.isArray(value);
}

/** A plain object, as a record must be (an object whose constructor is not a class). */
export function isPlainObject(value: unknown): value is Record<string, unknown> {
  if (!isObject(value)) return false;
  const ctor = (value as { constructor?: unknown }).constructor;
  if (ctor === undefined || typeof ctor !== "function") return true;
  const prototype = (ctor as { prototype?: unknown }).prototype;
  return isObject(prototype) && Object.prototype.hasOwnProperty.call(prototype, "isPrototypeOf");
}

/** Issues found so far, the path being read, and whether an issue stops the cross-element rules. */
export class Reader {
  readonly issues: Issue[] = [];
  /** A type error (not a range or length error) was found: the rules do not run. */
  aborted = false;
  readonly path: PathPart[] = [];

  fail(key: PathPart | undefined, message: string, stopsRules: boolean): void {
    const path = this.path.slice();
    if (key !== undefined) path.push(key);
    this.issues.push({ path, message });
    if (stopsRules) this.aborted = true;
  }

  /** The checks zod runs on anything with a length, even after a type error (a list given for a text). */
  lengthChecks(key: PathPart | undefined, value: unknown, min: number | undefined, minMessage: string, max: number | undefined, maxMessage: (value: unknown) => string): void {
    if (value === null || value === undefined) return;
    const units = (value as { length?: unknown }).length;
    if (units === undefined) return;
    if (min !== undefined) {
      const length = typeof value === "string" && (units as number) >= min && (units as number) < min * 2 ? codePoints(value) : units;
      if (!((length as number) >= min)) this.fail(key, minMessage, false);
    }
    if (max !== undefined) {
      const length = typeof value === "string" && (units as number) > max ? codePoints(value) : units;
      if (!((length as number) <= max)) this.fail(key, maxMessage(value), false);
    }
  }
}

function codePoints(text: string): number {
  let count = 0;
  for (let i = 0; i < text.length; i++) {
    const unit = text.charCodeAt(i);
    if (unit >= 0xd800 && unit <= 0xdbff && i + 1 < text.length) {
      const next = text.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) i++;
    }
    count++;
  }
  return count;
}

/** zod's own wording for a text or list that is too long (no custom message in the schema). */
export function tooLongMessage(max: number): (value: unknown) => string {
  return (value) => {
    const origin = typeof value === "string" ? "string" : Array.isArray(value) ? "array" : "unknown";
    if (origin === "string") return `Too big: expected string to have <=${max} characters`;
    if (origin === "array") return `Too big: expected array to have <=${max} items`;
    return `Too big: expected unknown to be <=${max}`;
  };
}

/** A field reader: reads `object[key]`, reports issues, returns the output value (undefined: leave out). */
export type FieldReader = (reader: Reader, key: PathPart | undefined, value: unknown) => unknown;

/** A trimmed text of 1 to `max` code points (ids and names). */
export function text(max: number): FieldReader {
  const tooLong = tooLongMessage(max);
  return (reader, key, value) => {
    if (typeof value !== "string") {
      reader.fail(key, typeMessage("string", value), true);
      reader.lengthChecks(key, value, 1, "must not be empty", max, tooLong);
      return value;
    }
    const trimmed = value.trim();
    reader.lengthChecks(key, trimmed, 1, "must not be empty", max, tooLong);
    return trimmed;
  };
}

/** A finite number within [min, max] (or above min), with the schema's messages. */
export function number(min?: number, max?: number, unit = "", options: { minExclusive?: boolean } = {}): FieldReader {
  const label = unit ? ` ${unit}` : "";
  const minMessage = options.minExclusive ? `must be above ${min}${label}` : `must be at least ${min}${label}`;
  const maxMessage = `must be at most ${max}${label}`;
  const exclusive = options.minExclusive === true;
  return (reader, key, value) => {
    if (typeof value !== "number" || !Number.isFinite(value)) {
      reader.fail(key, typeMessage("number", value), true);
      return value;
    }
    if (min !== undefined && !(exclusive ? value > min : value >= min)) reader.fail(key, minMessage, false);
    if (max !== undefined && !(value <= max)) reader.fail(key, maxMessage, false);
    return value;
  };
}

/** A whole number within [min, max], with the schema's messages. */
export function wholeNumber(min: number, max: number, wholeMessage: string, minMessage: string, maxMessage: string): FieldReader {
  return (reader, key, value) => {
    if (typeof value !== "number" || !Number.isFinite(value)) {
      reader.fail(key, typeMessage("number", value), true);
      return value;
    }
    if (!Number.isInteger(value)) {
      reader.fail(key, wholeMessage, true);
      return value;
    }
    if (!Number.isSafeInteger(value)) reader.fail(key, wholeMessage, false);
    if (!(value >= min)) reader.fail(key, minMessage, false);
    if (!(value <= max)) reader.fail(key, maxMessage, false);
    return value;
  };
}

/** One of a fixed list of texts. */
export function oneOf(values: readonly string[]): FieldReader {
  const message = `Invalid option: expected one of ${values.map((v) => `"${v}"`).join("|")}`;
  return (reader, key, value) => {
    if (!values.includes(value as string)) reader.fail(key, message, true);
    return value;
  };
}

/** Exactly this value: a text literal gives zod's wording with the value, numbers a plain "Invalid input" (a union of literals). */
export function literal(values: readonly (string | number)[]): FieldReader {
  const message = values.length === 1 && typeof values[0] === "string" ? `Invalid input: expected "${values[0]}"` : "Invalid input";
  return (reader, key, value) => {
    if (!values.includes(value as string | number)) reader.fail(key, message, true);
    return value;
  };
}

export const boolean: FieldReader = (reader, key, value) => {
  if (typeof value !== "boolean") reader.fail(key, typeMessage("boolean", value), true);
  return value;
};

/** The field may be absent. */
export function optional(read: FieldReader): FieldReader {
  return (reader, key, value) => (value === undefined ? undefined : read(reader, key, value));
}

/** Absent means this value (not itself checked); a list default is a new empty list each time. */
export function withDefault(read: FieldReader, fallback: unknown): FieldReader {
  const fresh = Array.isArray(fallback) ? () => [] : () => fallback;
  return (reader, key, value) => (value === undefined ? fresh() : read(reader, key, value));
}

/** An object with exactly these fields (in this order in the output); any other field is named. */
export function object(fields: Record<string, FieldReader>): FieldReader {
  const keys = Object.keys(fields);
  const readers = keys.map((k) => fields[k]);
  const known = new Set(keys);
  return (reader, key, value) => {
    if (!isObject(value)) {
      reader.fail(key, typeMessage("object", value), true);
      return value;
    }
    const path = reader.path;
    if (key !== undefined) path.push(key);
    const out: Record<string, unknown> = {};
    for (let f = 0; f < keys.length; f++) {
      const k = keys[f];
      const read = readers[f](reader, k, value[k]);
      if (read !== undefined) out[k] = read;
    }
    let unknown: string[] | undefined;
    for (const k in value) if (!known.has(k)) (unknown ??= []).push(k);
    if (unknown) reader.fail(undefined, `unknown field${unknown.length > 1 ? "s" : ""} ${unknown.map((k) => `"${k}"`).join(", ")}`, false);
    if (key !== undefined) path.pop();
    return out;
  };
}

/** A list of `item`s, with the schema's length rules and messages. */
export function list(item: FieldReader, length: { min?: number; minMessage?: string; max?: number; maxMessage?: string } = {}): FieldReader {
  const minMessage = length.minMessage ?? "";
  const maxMessage = () => length.maxMessage ?? "";
  return (reader, key, value) => {
    if (!Array.isArray(value)) {
      reader.fail(key, typeMessage("array", value), true);
      reader.lengthChecks(key, value, length.min, minMessage, length.max, maxMessage);
      return value;
    }
    const path = reader.path;
    path.push(key!);
    const out = new Array(value.length);
    for (let i = 0; i < value.length; i++) out[i] = item(reader, i, value[i]);
    path.pop();
    reader.lengthChecks(key, value, length.min, minMessage, length.max, maxMessage);
    return out;
  };
}

/** A record of text keys to `item`s. */
export function record(item: FieldReader): FieldReader {
  return (reader, key, value) => {
    if (!isPlainObject(value)) {
      reader.fail(key, typeMessage("record", value), true);
      return value;
    }
    const path = reader.path;
    path.push(key!);
    const out: Record<string, unknown> = {};
    for (const k of Object.keys(value)) out[k] = item(reader, k, value[k]);
    path.pop();
    return out;
  };
}

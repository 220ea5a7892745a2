// Text that PostgreSQL can store and keys that cannot reach an object's prototype. PostgreSQL refuses the null
// character in text and jsonb, and unpaired UTF-16 surrogate halves cannot be encoded as UTF-8 at all; both are
// refused at the edge with a message instead of failing deep inside a write. Pure: used by zod schemas, the
// request parser, the socket events and the model validator.

/** True when the string has no null character and no unpaired surrogate half. */
export function isStorableText(value: string): boolean {
  return !value.includes("\u0000") && value.isWellFormed();
}

export const UNSTORABLE_TEXT_MESSAGE = "Text cannot contain null characters (U+0000) or unpaired surrogate halves: remove them and try again.";

/**
 * Names an object has through Object.prototype ("__proto__", "constructor", "toString", …). Used as ids or keys they
 * would read or replace inherited values, so ids and keys from users are refused when they are one of these.
 */
export const RESERVED_NAMES: ReadonlySet<string> = new Set(Object.getOwnPropertyNames(Object.prototype));

export function reservedNameMessage(name: string): string {
  return `"${name}" is a reserved name: choose another.`;
}

/** A problem found in user-sent data, with the path of the offending value or key. */
export type TextProblem = { path: (string | number)[]; message: string };

/**
 * Walks parsed JSON (or form values) and lists every string value or key that cannot be stored, and every
 * "__proto__" key (JSON.parse keeps it as an own key, but copying the object would replace its prototype).
 * Iterative, so deep nesting cannot overflow the stack; stops after `max` problems.
 */
export function findUnstorableText(value: unknown, max = 20): TextProblem[] {
  const problems: TextProblem[] = [];
  // Paths are kept as parent links and spelled out only for a problem, so deep nesting stays linear.
  type Step = { value: unknown; key: string | number | null; parent: Step | null };
  const pathOf = (step: Step, last?: string) => {
    const path: (string | number)[] = last === undefined ? [] : [last];
    for (let s: Step | null = step; s && s.key !== null; s = s.parent) path.unshift(s.key);
    return path;
  };
  const stack: Step[] = [{ value, key: null, parent: null }];
  while (stack.length && problems.length < max) {
    const step = stack.pop()!;
    const current = step.value;
    if (typeof current === "string") {
      if (!isStorableText(current)) problems.push({ path: pathOf(step), message: UNSTORABLE_TEXT_MESSAGE });
    } else if (Array.isArray(current)) {
      for (let k = current.length - 1; k >= 0; k--) stack.push({ value: current[k], key: k, parent: step });
    } else if (current !== null && typeof current === "object" && isPlainObject(current)) {
      for (const key of Object.keys(current)) {
        if (!isStorableText(key)) problems.push({ path: pathOf(step, key), message: UNSTORABLE_TEXT_MESSAGE });
        else if (key === "__proto__") problems.push({ path: pathOf(step, key), message: reservedNameMessage(key) });
        else stack.push({ value: (current as Record<string, unknown>)[key], key, parent: step });
      }
    }
  }
  return problems;
}

function isPlainObject(value: object): boolean {
  const proto = Object.getPrototypeOf(value);
  return proto === Object.prototype || proto === null;
}

/** A file name safe to store and to offer for download: one line, no folder parts, storable text. */
export function fileNameProblem(name: string): string | undefined {
  if (!isStorableText(name)) return UNSTORABLE_TEXT_MESSAGE;
  if (/[\u0000-\u001f\u007f]/.test(name)) return "File names cannot contain line breaks or control characters.";
  if (/[\\/]/.test(name) || name === "." || name === "..") return "Give the file name alone, without folders (no / or \\).";
  return undefined;
}

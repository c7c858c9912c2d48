/**
 * Escaping for the report: HTML text and attributes, and JSON embedded in a script element.
 *
 * @module
 */

const HTML: Record<string, string> = {
  "&": "&amp;",
  "<": "&lt;",
  ">": "&gt;",
  '"': "&quot;",
  "'": "&#39;",
};

/** Escapes a string for HTML text or a quoted attribute. */
export function escapeHtml(value: unknown): string {
  return String(value ?? "").replace(/[&<>"']/g, (c) => HTML[c]!);
}

/** JSON safe to place inside `<script type="application/json">` (no `</script`, no U+2028). */
export function jsonForScript(value: unknown): string {
  return scriptSafe(JSON.stringify(value));
}

/** The characters a script element must not hold raw, and their JSON escapes. */
const SCRIPT_UNSAFE: Record<string, string> = {
  "<": "\\u003c",
  ">": "\\u003e",
  "&": "\\u0026",
  "\u2028": "\\u2028",
  "\u2029": "\\u2029",
};

/** JSON text with the characters a script element must not hold written as escapes. */
function scriptSafe(json: string): string {
  return json.replace(/[<>&\u2028\u2029]/g, (c) => SCRIPT_UNSAFE[c]!);
}

/**
 * {@linkcode jsonForScript} of a value in parts that join to the same text. A plain object's
 * members, and the items of its members that are plain arrays or plain objects, are each written
 * on their own, so a large page's data is never held as one string (nor as the copies each escape
 * would make of it). Anything else (a `toJSON`, a boxed primitive) is written as JSON writes it.
 */
export function jsonForScriptParts(value: unknown): string[] {
  if (!isPlainObject(value)) return [jsonForScript(value)];
  const parts: string[] = ["{"];
  let first = true;
  for (const [key, member] of Object.entries(value)) {
    const name = `${first ? "" : ","}${scriptSafe(JSON.stringify(key))}:`;
    if (Array.isArray(member) && isPlain(member, Array.prototype)) {
      parts.push(name, "[");
      // by index: a gap in the array is null, as JSON writes it
      for (let i = 0; i < member.length; i++) {
        parts.push((i ? "," : "") + scriptSafe(memberJson(String(i), member[i]) ?? "null"));
      }
      parts.push("]");
    } else if (isPlainObject(member)) {
      parts.push(name, "{");
      let firstItem = true;
      for (const [k, item] of Object.entries(member)) {
        const text = memberJson(k, item);
        if (text === undefined) continue;
        parts.push(`${firstItem ? "" : ","}${scriptSafe(JSON.stringify(k))}:${scriptSafe(text)}`);
        firstItem = false;
      }
      parts.push("}");
    } else {
      const text = memberJson(key, member);
      if (text === undefined) continue; // left out, as JSON leaves it out
      parts.push(name + scriptSafe(text));
    }
    first = false;
  }
  parts.push("}");
  return parts;
}

/**
 * The JSON of a value as a member of an object or array under `key` (a `toJSON` is given that
 * key, as JSON.stringify gives it), or undefined when JSON leaves the member out.
 */
function memberJson(key: string, value: unknown): string | undefined {
  const holder = JSON.stringify({ [key]: value });
  return holder === "{}" ? undefined : holder.slice(JSON.stringify(key).length + 2, -1);
}

/** True for an object of exactly this prototype (or none) without a `toJSON` of its own. */
function isPlain(v: object, prototype: object): boolean {
  const p = Object.getPrototypeOf(v);
  return (p === prototype || p === null) &&
    typeof (v as { toJSON?: unknown }).toJSON !== "function";
}

/** An object JSON writes member by member: a plain object without `toJSON`. */
function isPlainObject(v: unknown): v is Record<string, unknown> {
  return !!v && typeof v === "object" && !Array.isArray(v) && isPlain(v, Object.prototype);
}

/** Library source safe to inline in a script element. */
export function scriptForInline(source: string): string {
  return source.replace(/<\/script/gi, "<\\/script").replace(/<!--/g, "<\\!--");
}

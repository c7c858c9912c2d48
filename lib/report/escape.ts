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
 * {@linkcode jsonForScript} of an object in parts that join to the same text: each member of
 * the object, and each item of its arrays and objects, written on its own, so a large page's data
 * is never held as one string (nor as the copies each escape would make of it).
 */
export function jsonForScriptParts(value: Record<string, unknown>): string[] {
  const parts: string[] = ["{"];
  let first = true;
  for (const [key, member] of Object.entries(value)) {
    const whole = JSON.stringify(member);
    if (whole === undefined) continue; // left out, as JSON.stringify leaves it out
    parts.push(`${first ? "" : ","}${scriptSafe(JSON.stringify(key))}:`);
    first = false;
    if (Array.isArray(member)) {
      parts.push("[");
      member.forEach((item, i) => {
        parts.push((i ? "," : "") + scriptSafe(JSON.stringify(item) ?? "null"));
      });
      parts.push("]");
    } else if (isPlainObject(member)) {
      parts.push("{");
      let firstItem = true;
      for (const [k, item] of Object.entries(member)) {
        const text = JSON.stringify(item);
        if (text === undefined) continue;
        parts.push(`${firstItem ? "" : ","}${scriptSafe(JSON.stringify(k))}:${scriptSafe(text)}`);
        firstItem = false;
      }
      parts.push("}");
    } else parts.push(scriptSafe(whole));
  }
  parts.push("}");
  return parts;
}

/** An object JSON writes member by member (no toJSON of its own, not an array). */
function isPlainObject(v: unknown): v is Record<string, unknown> {
  return !!v && typeof v === "object" && !Array.isArray(v) &&
    typeof (v as { toJSON?: unknown }).toJSON !== "function";
}

/** Library source safe to inline in a script element. */
export function scriptForInline(source: string): string {
  return source.replace(/<\/script/gi, "<\\/script").replace(/<!--/g, "<\\!--");
}

import { describe, it } from "node:test";
import { expect } from "expect";
import fc from "fast-check";
import {
  escapeHtml,
  jsonForScript,
  jsonForScriptParts,
  scriptForInline,
} from "../../lib/report/mod.ts";
import { makeLot, runCli } from "../_run_cli.ts";

describe("report escaping", () => {
  it("escapes HTML text and attributes", () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe(
      "&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;",
    );
  });
  it("JSON for a script element cannot close it and still parses to the same value", () => {
    const value = { name: "</script><script>alert(1)</script>", line: "a\u2028b", amp: "&" };
    const text = jsonForScript(value);
    expect(text).not.toMatch(/<\/script/i);
    expect(text).not.toContain("\u2028");
    expect(JSON.parse(text)).toEqual(value);
    expect(scriptForInline("x = '</script>'")).not.toMatch(/<\/script/i);
  });

  it("property: the page data in parts joins to the same text as written whole (fast-check, seeded)", () => {
    // the escapes as first written, one replacement after another over the whole text
    const whole = (v: unknown) =>
      JSON.stringify(v).replace(/</g, "\\u003c").replace(/>/g, "\\u003e").replace(/&/g, "\\u0026")
        .replace(/\u2028/g, "\\u2028").replace(/\u2029/g, "\\u2029");
    const text = fc.string({
      unit: fc.constantFrom("a", "<", ">", "&", "\u2028", "\u2029", "é", '"'),
    });
    const leaf = fc.oneof(
      text,
      fc.double(),
      fc.integer(),
      fc.constant(null),
      fc.constant(undefined),
    );
    const member = fc.oneof(
      leaf,
      fc.array(fc.oneof(leaf, fc.dictionary(text, leaf))),
      fc.sparseArray(leaf),
      fc.dictionary(fc.oneof(text, fc.nat().map(String)), fc.oneof(leaf, fc.array(leaf))),
    );
    fc.assert(
      fc.property(fc.dictionary(text, member), (value) => {
        expect(jsonForScriptParts(value).join("")).toBe(whole(value));
        expect(jsonForScript(value)).toBe(whole(value));
      }),
      { seed: 41, numRuns: 400 },
    );
    // what JSON writes in its own way: toJSON (given the member's key), boxed primitives, dates,
    // functions and symbols, gaps, an array with a toJSON of its own, a toJSON at the top
    const keyed = { toJSON: (k: string) => `<${k}>` };
    const odd: unknown[] = [
      { a: [1, , 3], b: new Array(2), c: [keyed, keyed], d: { e: keyed }, f: keyed },
      { s: new String("ab"), n: new Number(5), t: Object(true), d: new Date(0) },
      { f: () => 1, y: Symbol("y"), u: undefined, list: [() => 1, Symbol("z"), undefined] },
      { a: Object.assign([1, 2], { toJSON: () => "arr" }), n: null },
      { toJSON: () => 1 },
      Object.assign(Object.create(null), { a: [1], b: { c: 2 } }),
      [1, { a: "<" }],
      "</script>",
    ];
    for (const v of odd) expect(jsonForScriptParts(v).join("")).toBe(whole(v));
  });
});

describe("crystint report", () => {
  it("re-renders index.html from a saved results.json", async () => {
    const lot = await makeLot(3, false);
    const out = await Deno.makeTempDir(), again = await Deno.makeTempDir();
    expect((await runCli("batch", lot, "--out", out, "--quiet")).code).toBe(0);
    const r = await runCli("report", `${out}/results.json`, "--out", again);
    expect(r.code).toBe(0);
    const html = await Deno.readTextFile(`${again}/index.html`);
    for (const name of ["stone-000", "stone-001", "stone-002"]) expect(html).toContain(name);
    expect((await runCli("report", `${lot}/stone-000.csv`, "--out", again)).code).toBe(1);
  });
});

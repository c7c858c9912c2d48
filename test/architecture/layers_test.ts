import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT } from "../_run_cli.ts";

/**
 * The layer order of lib/ (DEVELOPERS.md, "Architecture"), lowest first. Folders on one line
 * are peers: each may import only from lower lines, never from a peer.
 */
const LAYERS = [
  ["numeric"],
  ["spectrum"],
  ["io", "optics", "bands"],
  ["cie"],
  ["dopant"],
  ["analysis"],
  ["report"],
  ["batch"],
];
/** Files at the top of lib/: the version constant sits below everything, mod.ts above. */
const BOTTOM_FILES = ["version.ts"], TOP_FILES = ["mod.ts"];
/** The only files below batch that may touch the file system. */
const DENO_ALLOWED = [/^io\/read_file\.ts$/, /^batch\//];

function rankOf(rel: string): number {
  if (BOTTOM_FILES.includes(rel)) return -1;
  if (TOP_FILES.includes(rel)) return LAYERS.length;
  const folder = rel.split("/")[0]!;
  const rank = LAYERS.findIndex((line) => line.includes(folder));
  if (rank < 0) throw new Error(`lib/${rel}: folder "${folder}" is in no layer of the test`);
  return rank;
}

async function libSources(): Promise<Map<string, string>> {
  const out = new Map<string, string>();
  async function walk(dir: string) {
    for await (const e of Deno.readDir(`${ROOT}lib/${dir}`)) {
      const rel = dir ? `${dir}/${e.name}` : e.name;
      if (e.isDirectory) await walk(rel);
      else if (e.name.endsWith(".ts")) {
        out.set(rel, await Deno.readTextFile(`${ROOT}lib/${rel}`));
      }
    }
  }
  await walk("");
  return out;
}

/** A relative specifier resolved from a module under lib/; `../x` when it leaves lib/. */
function resolve(rel: string, spec: string): string {
  const parts = rel.split("/").slice(0, -1);
  let outside = 0;
  for (const p of spec.split("/")) {
    if (p === "..") {
      if (parts.length) parts.pop();
      else outside++;
    } else if (p !== ".") parts.push(p);
  }
  return "../".repeat(outside) + parts.join("/");
}

/** Relative imports and re-exports of a module, resolved to paths under lib/. */
function importsOf(rel: string, source: string): string[] {
  const specs = [
    ...source.matchAll(/(?:^|\n)\s*(?:import|export)\b[^;]*?\bfrom\s*"(\.[^"]+)"/g),
    ...source.matchAll(/import\(\s*"(\.[^"]+)"\s*\)/g),
    // new URL("./worker.ts", import.meta.url) spawns a module too
    ...source.matchAll(/new URL\(\s*"(\.[^"]+\.ts)"/g),
  ].map((m) => m[1]!);
  return specs.map((spec) => resolve(rel, spec));
}

describe("the layers of lib/", () => {
  it("every import runs down the layer order (or within one folder)", async () => {
    const sources = await libSources();
    const wrong: string[] = [];
    for (const [rel, text] of sources) {
      for (const target of importsOf(rel, text)) {
        if (target.startsWith("../")) {
          // only the package's own data may be read from outside lib/ (deno.json's version)
          if (target !== "../deno.json") wrong.push(`lib/${rel} → ${target} (outside lib/)`);
          continue;
        }
        if (!sources.has(target)) {
          wrong.push(`lib/${rel} imports lib/${target}, which does not exist`);
          continue;
        }
        const sameFolder = rel.split("/")[0] === target.split("/")[0] && rel.includes("/");
        if (sameFolder) continue;
        if (rankOf(target) >= rankOf(rel)) wrong.push(`lib/${rel} → lib/${target}`);
      }
    }
    expect(wrong).toEqual([]);
  });

  it("no module imports itself through a cycle", async () => {
    const sources = await libSources();
    const graph = new Map([...sources].map(([rel, text]) => [rel, importsOf(rel, text)]));
    const state = new Map<string, "open" | "done">();
    const cycles: string[] = [];
    const visit = (node: string, path: string[]) => {
      if (state.get(node) === "done") return;
      if (state.get(node) === "open") {
        cycles.push([...path.slice(path.indexOf(node)), node].join(" → "));
        return;
      }
      state.set(node, "open");
      for (const next of graph.get(node) ?? []) visit(next, [...path, node]);
      state.set(node, "done");
    };
    for (const node of graph.keys()) visit(node, []);
    expect(cycles).toEqual([]);
  });

  it("only the file reader and the batch touch Deno.*", async () => {
    const sources = await libSources();
    const touching = [...sources].filter(([rel, text]) =>
      /\bDeno\.[a-zA-Z]/.test(text.replace(/\/\/.*|\/\*[\s\S]*?\*\//g, "")) &&
      !DENO_ALLOWED.some((re) => re.test(rel))
    ).map(([rel]) => rel);
    expect(touching).toEqual([]);
  });

  it("the checks can fail: an upward import and a cycle are caught", () => {
    expect(rankOf("numeric/x.ts")).toBeLessThan(rankOf("batch/y.ts"));
    expect(importsOf("cie/a.ts", `import { x } from "../batch/run_batch.ts";`)).toEqual([
      "batch/run_batch.ts",
    ]);
    expect(
      importsOf("io/a.ts", `export * from "./b.ts";\nimport type { T } from "../spectrum/s.ts";`),
    )
      .toEqual(["io/b.ts", "spectrum/s.ts"]);
  });
});

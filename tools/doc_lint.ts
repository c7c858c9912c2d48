/**
 * `deno doc --lint lib/mod.ts`, with the type-resolution warnings that come from inside
 * node_modules' @types/node left out of the output (they are not about this project).
 * Exits with the linter's own code.
 *
 * @module
 */
const out = await new Deno.Command(Deno.execPath(), {
  args: ["doc", "--lint", "lib/mod.ts"],
  stdout: "piped",
  stderr: "piped",
}).output();
const text = new TextDecoder().decode(out.stdout) + new TextDecoder().decode(out.stderr);
const lines = text.split("\n");
const kept = lines.filter((line, i) =>
  !/Failed resolving types/.test(line) &&
  !(/node_modules\/\.deno\/@types\+node/.test(line) && /Failed resolving/.test(lines[i - 1] ?? ""))
);
console.log(kept.join("\n").trim());
Deno.exit(out.code);

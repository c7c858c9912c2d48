import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT } from "../_run_cli.ts";

describe("the library face for programs outside the repository", () => {
  it("a script in a temporary folder imports lib/mod.ts by path and computes a colour", async () => {
    const dir = await Deno.makeTempDir({ prefix: "crystint-outside-" });
    const script = `${dir}/use_crystint.ts`;
    await Deno.writeTextFile(
      script,
      `import { deltaE2000, readSpectraFromBytes, spectrumColor, VERSION } from ${
        JSON.stringify(`file://${ROOT}lib/mod.ts`)
      };
const rows = ["wavelength_nm,T"];
for (let nm = 360; nm <= 830; nm += 5) rows.push(nm + "," + (nm > 600 ? 0.8 : 0.3));
const [s] = readSpectraFromBytes(new TextEncoder().encode(rows.join("\\n")), "x.csv");
const [row] = spectrumColor(s!, { illuminants: ["D65"], observers: ["2"] });
console.log(JSON.stringify({ version: VERSION, L: row!.L, a: row!.a, dE: deltaE2000({ L: 50, a: 0, b: 0 }, { L: 51, a: 0, b: 0 }) }));
`,
    );
    const out = await new Deno.Command(Deno.execPath(), {
      args: ["run", "--no-config", `--allow-read`, script],
      cwd: dir,
      stdout: "piped",
      stderr: "piped",
      env: { NO_COLOR: "1" },
    }).output();
    const stderr = new TextDecoder().decode(out.stderr);
    expect({ code: out.code, stderr: out.code === 0 ? "" : stderr }).toEqual({
      code: 0,
      stderr: "",
    });
    const result = JSON.parse(new TextDecoder().decode(out.stdout));
    expect(result.a).toBeGreaterThan(0); // transmits red: a* > 0
    // a pure lightness step: ΔE00 = ΔL / S_L with S_L = 1 + 0.015(L̄−50)²/√(20+(L̄−50)²)
    // (Sharma, Wu & Dalal 2005, eq. 10), L̄ = 50.5
    const sl = 1 + (0.015 * 0.25) / Math.sqrt(20.25);
    expect(result.dE).toBeCloseTo(1 / sl, 12);
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { runCli } from "../_run_cli.ts";
import { COMMANDS } from "../../cli/commands.ts";
import { COMMAND_INDEX } from "../../cli/command_index.ts";
import {
  commandOptions,
  type CommandSpec,
  helpText,
  parseCommand,
  parseConfig,
} from "../../cli/_command.ts";
import { mainHelp } from "../../cli/main.ts";
import { SETTINGS_KEYS } from "../../cli/batch.ts";
import { defaultSettings, resolveSettings } from "../../lib/batch/mod.ts";
import { flagHint, withFlagHint } from "../../cli/_shared.ts";

describe("command tables (cli/_command.ts)", () => {
  it("every option the parser accepts appears in the command's help", () => {
    for (const spec of COMMANDS) {
      const help = helpText(spec);
      for (const name of Object.keys(parseConfig(spec))) {
        expect({ command: spec.name, option: name, found: help.includes(`--${name}`) })
          .toEqual({ command: spec.name, option: name, found: true });
      }
      for (const o of commandOptions(spec)) {
        if (o.short) expect(help).toContain(`-${o.short}, --${o.name}`);
      }
    }
  });

  it("the main help lists every command with its one-line summary", () => {
    const help = mainHelp();
    for (const spec of COMMANDS) expect(help).toContain(`${spec.name}`);
    for (const spec of COMMANDS) expect(help).toContain(spec.summary);
  });

  it("the start-up index loads, for each name and summary, that very command table", async () => {
    expect(COMMAND_INDEX.map((c) => [c.name, c.summary]))
      .toEqual(COMMANDS.map((c) => [c.name, c.summary]));
    for (const entry of COMMAND_INDEX) {
      expect(await entry.load()).toBe(COMMANDS.find((c) => c.name === entry.name));
    }
  });

  it("every command's help names the 2° default observer when it has --observer", () => {
    for (const spec of COMMANDS) {
      const observer = spec.options.find((o) => o.name === "observer");
      if (!observer) continue;
      expect(observer.default).toBe("2");
      expect(helpText(spec).replace(/\s+/g, " ")).toContain("CIE 15:2018 §3");
    }
  });

  it("every command that reads spectra offers --alpha-base and says what α means", () => {
    const reading = COMMANDS.filter((c) => c.options.some((o) => o.name === "ordinate"));
    expect(reading.map((c) => c.name).sort()).toEqual(
      [
        "aim",
        "bands",
        "batch",
        "calibrate",
        "change",
        "color",
        "convert",
        "metamerism",
        "pleochroism",
        "predict",
        "series",
      ],
    );
    for (const spec of reading) {
      expect(parseConfig(spec)).toHaveProperty("alpha-base");
      expect(helpText(spec).replace(/\s+/g, " ")).toMatch(/A = α·d ?\/ ?ln 10/);
    }
  });

  it("a run function reading an undeclared option is a programming error, not a silent undefined", () => {
    const spec: CommandSpec = {
      name: "probe",
      summary: "probe",
      usage: [""],
      options: [{ name: "path", type: "string", help: "p" }],
      examples: [""],
      run: () => Promise.resolve(0),
    };
    const parsed = parseCommand(spec, ["--path", "3"]);
    expect(parsed.string("path")).toBe("3");
    expect(() => parsed.string("thickness")).toThrow(TypeError);
    expect(() => parsed.flag("path")).toThrow(TypeError);
  });

  it("--help exits 0 for every command (subprocess)", async () => {
    for (const spec of COMMANDS) {
      const r = await runCli(spec.name, "--help");
      expect({ command: spec.name, code: r.code }).toEqual({ command: spec.name, code: 0 });
      expect(r.stdout).toBe(helpText(spec) + "\n");
    }
  });

  it("batch --help lists every settings key, and every listed key is a real setting", () => {
    const help = helpText(COMMANDS.find((c) => c.name === "batch")!);
    for (const key of Object.keys(defaultSettings())) expect(help).toContain(`${key} —`);
    for (const [key] of SETTINGS_KEYS) {
      // resolveSettings refuses unknown keys ("Unknown setting"); other complaints are about
      // the value, which proves the key is known
      let message = "";
      try {
        resolveSettings({ [key]: null });
      } catch (e) {
        message = (e as Error).message;
      }
      expect(message).not.toMatch(/Unknown setting/);
      expect(help).toContain(`${key} —`);
    }
  });
});

describe("flagHint() and withFlagHint()", () => {
  it("turn a library error's machine hint into the option to give", () => {
    expect(flagHint("thickness")).toBe("--thickness MM");
    expect(flagHint("alphaBase")).toBe("--alpha-base e|10");
    expect(flagHint("rangeNm")).toBe("--range-nm");
    const e = Object.assign(new RangeError("The measured thickness is not known"), {
      need: "thickness",
    });
    expect(withFlagHint(e)).toBe("The measured thickness is not known (give --thickness MM)");
    // a message that already names the flag is not repeated
    const worded = Object.assign(new RangeError("Not known (give --thickness)"), {
      need: "thickness",
    });
    expect(withFlagHint(worded)).toBe("Not known (give --thickness)");
    expect(withFlagHint(new Error("plain"))).toBe("plain");
  });
});

/**
 * One table per command: options, help text, parser configuration and the main help's command
 * list are all generated from a {@linkcode CommandSpec}, so they cannot drift apart.
 *
 * @module
 */
import { parseArgs, type ParseArgsOptionsConfig } from "node:util";
import { EXIT, UsageError } from "./_shared.ts";

/** One command-line option. */
export interface OptionSpec {
  /** Long name without the dashes, e.g. `thickness`. */
  name: string;
  type: "string" | "boolean";
  /** One-letter alias, e.g. `h`. */
  short?: string;
  /** Name of the option's argument in help, e.g. `MM` (string options). */
  arg?: string;
  /** Help text; may hold several sentences, wrapped when printed. */
  help: string;
  /** The default as help shows it (text, not a value the parser applies). */
  default?: string;
  /** The option may be given more than once. */
  multiple?: boolean;
}

/** What a command's run function receives. */
export interface ParsedArgs {
  positionals: string[];
  /** A string option's value (the last one when given twice), or undefined. */
  string(name: string): string | undefined;
  /** Every value of a `multiple` string option. */
  strings(name: string): string[];
  /** A boolean option. */
  flag(name: string): boolean;
}

/** A command: its help, its options and what it does. */
export interface CommandSpec {
  name: string;
  /** One line for the main help's command list. */
  summary: string;
  /** Usage lines without the leading `crystint NAME` (e.g. `FILE… [options]`). */
  usage: string[];
  /** Options in the order help shows them (shared groups spread in); `--help` is added. */
  options: OptionSpec[];
  /** What the positional arguments are. */
  positionals?: string;
  /** Paragraphs after the options: output columns, conventions, exit codes. */
  notes?: string[];
  examples: string[];
  /** Rewrites the raw arguments before parsing (e.g. `--uncertainty mc`). */
  prepareArgs?: (args: string[]) => string[];
  run(args: ParsedArgs): Promise<number>;
}

const HELP_OPTION: OptionSpec = {
  name: "help",
  type: "boolean",
  short: "h",
  help: "show this help",
};
const WIDTH = 100;

/** Every option the command's parser accepts, `--help` included. */
export function commandOptions(spec: CommandSpec): OptionSpec[] {
  return [...spec.options, HELP_OPTION];
}

/** Words of `text` in lines of at most `width` characters, later lines indented. */
export function wrap(text: string, width: number, indent: string): string[] {
  const lines: string[] = [];
  let line = "";
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines.map((l, i) => (i === 0 ? l : indent + l));
}

function optionLabel(o: OptionSpec): string {
  const long = `--${o.name}${o.type === "string" ? ` ${o.arg ?? "VALUE"}` : ""}`;
  return o.short ? `-${o.short}, ${long}` : long;
}

/** The `--help` text of a command. */
export function helpText(spec: CommandSpec): string {
  const out: string[] = [`crystint ${spec.name} — ${spec.summary}`, "", "Usage:"];
  for (const u of spec.usage) out.push(`  crystint ${spec.name} ${u}`);
  if (spec.positionals) out.push("", ...wrap(spec.positionals, WIDTH, ""));
  out.push("", "Options:");
  const labels = commandOptions(spec).map(optionLabel);
  const col = Math.min(28, Math.max(...labels.map((l) => l.length)) + 4);
  commandOptions(spec).forEach((o, i) => {
    const label = labels[i]!;
    let text = o.help;
    if (o.default !== undefined) text += ` (default: ${o.default})`;
    if (o.multiple) text += " May be given more than once.";
    const body = wrap(text, WIDTH - col, " ".repeat(col));
    if (label.length + 4 > col) {
      out.push(`  ${label}`, " ".repeat(col) + body.join("\n"));
    } else out.push(`  ${label.padEnd(col - 2)}${body.join("\n")}`);
  });
  for (const note of spec.notes ?? []) out.push("", ...wrap(note, WIDTH, ""));
  out.push("", spec.examples.length > 1 ? "Examples:" : "Example:");
  for (const e of spec.examples) out.push(`  crystint ${spec.name} ${e}`);
  return out.join("\n") + "\n";
}

/** The `node:util` parseArgs configuration of a command. */
export function parseConfig(spec: CommandSpec): ParseArgsOptionsConfig {
  const config: ParseArgsOptionsConfig = {};
  for (const o of commandOptions(spec)) {
    if (config[o.name]) throw new TypeError(`Option --${o.name} is declared twice in ${spec.name}`);
    config[o.name] = {
      type: o.type,
      ...(o.short ? { short: o.short } : {}),
      ...(o.multiple ? { multiple: true } : {}),
    };
  }
  return config;
}

function cleanParserMessage(message: string): string {
  // node:util's messages quote the option oddly and append advice that refers to "--"
  const unknown = /Unknown option '([^']+)'/.exec(message);
  if (unknown) return `Unknown option "${unknown[1]}"`;
  const missing = /Option '([^']+)' argument missing/.exec(message);
  if (missing) {
    return `Option "${missing[1]!.replace(/^-\w, /, "").replace(/ <value>$/, "")}" needs a value`;
  }
  return message.split(". To specify")[0]!.replace(/'/g, '"');
}

/** Parses a command's arguments against its spec. */
export function parseCommand(spec: CommandSpec, args: string[]): ParsedArgs & { help: boolean } {
  let parsed;
  try {
    parsed = parseArgs({ args, options: parseConfig(spec), allowPositionals: true, strict: true });
  } catch (e) {
    throw new UsageError(cleanParserMessage((e as Error).message));
  }
  const values = parsed.values as Record<string, string | boolean | string[] | undefined>;
  const declared = new Map(commandOptions(spec).map((o) => [o.name, o]));
  const check = (name: string, type: OptionSpec["type"]) => {
    const o = declared.get(name);
    if (!o || o.type !== type) {
      throw new TypeError(
        `Command ${spec.name} reads --${name} as ${type} but does not declare it`,
      );
    }
    return o;
  };
  return {
    positionals: parsed.positionals,
    help: values["help"] === true,
    string(name) {
      check(name, "string");
      const v = values[name];
      return Array.isArray(v) ? v[v.length - 1] : (v as string | undefined);
    },
    strings(name) {
      check(name, "string");
      const v = values[name];
      return v === undefined ? [] : Array.isArray(v) ? v : [v as string];
    },
    flag(name) {
      check(name, "boolean");
      return values[name] === true;
    },
  };
}

/** Parses, prints help when asked, and runs the command; returns the exit code. */
export async function runCommand(spec: CommandSpec, args: string[]): Promise<number> {
  const parsed = parseCommand(spec, spec.prepareArgs ? spec.prepareArgs(args) : args);
  if (parsed.help) {
    console.log(helpText(spec));
    return EXIT.ok;
  }
  return await spec.run(parsed);
}

import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT } from "../_run_cli.ts";
import { runMeasured, variant } from "./_hostile.ts";
import {
  joinSheet,
  lockOutput,
  parseManifest,
  removeStaleTemporaries,
} from "../../lib/batch/mod.ts";
import { TEMP_PREFIX } from "../../lib/batch/atomic_write.ts";

const FIXTURE = `${ROOT}test/fixtures/colour/cr_corundum_5nm.csv`;
const PERMS = ["-R", "-W", "--allow-env=LOG_TOKENS,LOG_STREAM", "--allow-sys=cpus,osRelease"];

async function lotOf(n: number): Promise<string> {
  const dir = await Deno.makeTempDir({ prefix: "crystint-safe-" });
  const base = await Deno.readTextFile(FIXTURE);
  for (let i = 0; i < n; i++) {
    await Deno.writeTextFile(`${dir}/s${String(i).padStart(3, "0")}.csv`, variant(base, i));
  }
  return dir;
}

/** A pid that belonged to a process which has exited (and was reaped). */
async function deadPid(): Promise<number> {
  const child = new Deno.Command("true").spawn();
  await child.status;
  return child.pid;
}

async function outputsOf(dir: string): Promise<string[]> {
  return await Promise.all(
    ["results.json", "results.csv", "index.html"].map((n) =>
      Deno.readTextFile(`${dir}/${n}`).catch(() => "")
    ),
  );
}

describe("exact sample-sheet matching (issue 16 item 5)", () => {
  it("1.csv is not 11.csv; a base name shared by two files is an error naming both; relative paths disambiguate", () => {
    const rows = parseManifest(
      "file,sample,thickness_mm\n1.csv,ONE,1\n11.csv,ELEVEN,2\nS1.csv,ESS,3\ndup.csv,D,4\n",
      "sheet.csv",
    );
    const files = [
      "lot/1.csv",
      "lot/11.csv",
      "lot/S1.csv",
      "lot/S11.csv",
      "lot/a/dup.csv",
      "lot/b/dup.csv",
    ];
    const rel = new Map(files.map((f) => [f, f.slice(4)]));
    const join = joinSheet(rows, files, rel);
    expect(join.rows.get("lot/1.csv")?.sample).toBe("ONE");
    expect(join.rows.get("lot/11.csv")?.sample).toBe("ELEVEN");
    expect(join.rows.get("lot/S1.csv")?.sample).toBe("ESS");
    expect(join.rows.has("lot/S11.csv")).toBe(false);
    expect(join.ambiguous.get("lot/a/dup.csv")).toMatch(
      /sample sheet line 5 \(file "dup\.csv"\) matches both lot\/a\/dup\.csv and lot\/b\/dup\.csv/,
    );
    expect(join.ambiguous.has("lot/b/dup.csv")).toBe(true);
    const exact = joinSheet(parseManifest("file,sample\nb/dup.csv,B\n", "s.csv"), files, rel);
    expect(exact.rows.get("lot/b/dup.csv")?.sample).toBe("B");
    expect(exact.ambiguous.size).toBe(0);
    const twice = joinSheet(
      parseManifest("file,sample\n1.csv,X\n./1.csv,Y\n", "s.csv"),
      files,
      rel,
    );
    expect(twice.ambiguous.get("lot/1.csv")).toMatch(/lines 2 and 3 both name this file/);
  });

  it("in a batch: 11.csv keeps its own row; the ambiguous files fail with both names, the rest go on", async () => {
    const lot = await Deno.makeTempDir({ prefix: "crystint-sheet-" });
    const base = await Deno.readTextFile(FIXTURE);
    await Deno.mkdir(`${lot}/a`);
    await Deno.mkdir(`${lot}/b`);
    for (const [i, f] of ["1.csv", "11.csv", "a/x.csv", "b/x.csv"].entries()) {
      await Deno.writeTextFile(`${lot}/${f}`, variant(base, i));
    }
    const sheet = `${lot}/samples.csv`;
    await Deno.writeTextFile(
      sheet,
      "file,sample,thickness_mm\n1.csv,ONE,1\n11.csv,ELEVEN,2\nx.csv,EX,3\n",
    );
    const out = await Deno.makeTempDir();
    const r = await runMeasured(PERMS, [
      "batch",
      lot,
      "--out",
      out,
      "--manifest",
      sheet,
      "--quiet",
    ]);
    expect(r.code).toBe(2);
    const results = JSON.parse(await Deno.readTextFile(`${out}/results.json`));
    const byFile = Object.fromEntries(
      results.samples.map((
        s: { file: string; sample: string },
      ) => [s.file.slice(lot.length + 1), s.sample]),
    );
    expect(byFile).toEqual({ "1.csv": "ONE", "11.csv": "ELEVEN" });
    expect(results.errors.map((e: { message: string }) => e.message)).toEqual([
      `${lot}/a/x.csv: sample sheet line 4 (file "x.csv") matches both ${lot}/a/x.csv and ${lot}/b/x.csv; give the path relative to the input folder`,
      `${lot}/b/x.csv: sample sheet line 4 (file "x.csv") matches both ${lot}/a/x.csv and ${lot}/b/x.csv; give the path relative to the input folder`,
    ]);
  });
});

describe("one writer per output folder (issue 16 item 7)", () => {
  it("a live lock stops a second writer; a killed owner's lock is taken over; under the lock only dead runs' temporaries are removed", async () => {
    const out = await Deno.makeTempDir();
    // a lock file left with a pid but no live holder is simply taken
    await Deno.writeTextFile(`${out}/.crystint-lock`, JSON.stringify({ pid: await deadPid() }));
    const lock = await lockOutput(out);
    expect(JSON.parse(await Deno.readTextFile(`${out}/.crystint-lock`)).pid).toBe(Deno.pid);
    await lock.release();
    expect(await Deno.readTextFile(`${out}/.crystint-lock`)).toBe("");
    // another live process holding the lock
    const holder = new Deno.Command(Deno.execPath(), {
      args: [
        "eval",
        `import { lockOutput } from ${JSON.stringify(`${ROOT}lib/batch/output_lock.ts`)};
         await lockOutput(${JSON.stringify(out)}); console.log("locked");
         await new Promise((r) => setTimeout(r, 60000));`,
      ],
      stdout: "piped",
      stderr: "null",
    }).spawn();
    const reader = holder.stdout.pipeThrough(new TextDecoderStream()).getReader();
    expect((await reader.read()).value).toMatch(/locked/);
    await expect(lockOutput(out)).rejects.toThrow(
      `output folder in use by crystint process ${holder.pid}`,
    );
    // temporaries written by the holder while it runs
    await Deno.writeTextFile(`${out}/${TEMP_PREFIX}${holder.pid}-results.json-a`, "holder's");
    // killed: the system drops its lock and the next run takes it over
    holder.kill("SIGKILL");
    await holder.status;
    await reader.cancel();
    const again = await lockOutput(out);
    expect(JSON.parse(await Deno.readTextFile(`${out}/.crystint-lock`)).pid).toBe(Deno.pid);
    // under the lock: the dead holder's and older unnamed temporaries go, this run's stay
    await Deno.writeTextFile(`${out}/${TEMP_PREFIX}${Deno.pid}-results.json-b`, "ours");
    await Deno.writeTextFile(`${out}/${TEMP_PREFIX}results.json-c`, "old style, no pid");
    expect(await removeStaleTemporaries(out)).toBe(2);
    expect([...Deno.readDirSync(out)].map((e) => e.name).filter((n) => n.startsWith(TEMP_PREFIX)))
      .toEqual([`${TEMP_PREFIX}${Deno.pid}-results.json-b`]);
    await again.release();
  });

  it("two batches on one --out, ten times: no crash, no stack trace; the outputs are one run's, complete", async () => {
    const lotA = await lotOf(40), lotB = await lotOf(25);
    const out = await Deno.makeTempDir();
    for (let round = 0; round < 10; round++) {
      const [a, b] = await Promise.all([
        runMeasured(PERMS, ["batch", lotA, "--out", out, "--quiet", "--workers", "1"]),
        runMeasured(PERMS, ["batch", lotB, "--out", out, "--quiet", "--workers", "1"]),
      ]);
      for (const r of [a, b]) {
        expect([0, 1]).toContain(r.code);
        if (r.code === 1) { // the owner may not have written its pid yet: then it is "(unknown)"
          expect(r.stderr).toMatch(/output folder in use by crystint process (\d+|\(unknown\))/);
        }
        expect(r.stderr).not.toMatch(/^ {4}at /m);
      }
      expect(a.code === 0 || b.code === 0).toBe(true);
      const [json, csv, html] = await outputsOf(out);
      const results = JSON.parse(json!);
      expect([25, 40]).toContain(results.samples.length);
      expect(csv!.trim().split("\n").length).toBe(1 + results.samples.length * 4);
      expect(html).toContain(results.samples[0].sample);
    }
    expect(
      [...Deno.readDirSync(out)].map((e) => e.name).filter((n) => n.startsWith(".crystint-tmp")),
    )
      .toEqual([]);
    expect(await Deno.readTextFile(`${out}/.crystint-lock`)).toBe("");
  });
});

describe("environment errors (issue 16 item 8)", () => {
  it("write permission denied: exit 1, one line naming the folder and the cause, nothing written", async () => {
    const lot = await lotOf(2);
    const out = await Deno.makeTempDir();
    const r = await runMeasured(
      [
        "-R",
        `--allow-write=${lot}`,
        "--allow-env=LOG_TOKENS,LOG_STREAM",
        "--allow-sys=cpus,osRelease",
      ],
      ["batch", lot, "--out", `${out}/report`],
    );
    expect(r.code).toBe(1);
    expect(r.stderr.trim()).toBe(
      `crystint batch: ${out}/report: cannot write: not allowed by the run's permissions`,
    );
  });

  async function mountTmpfs(sizeKb: number): Promise<string | undefined> {
    const dir = await Deno.makeTempDir({ prefix: "crystint-tmpfs-" });
    try {
      const r = await new Deno.Command("mount", {
        args: ["-t", "tmpfs", "-o", `size=${sizeKb}k`, "tmpfs", dir],
        stderr: "null",
      }).output();
      return r.success ? dir : undefined;
    } catch {
      return undefined;
    }
  }
  async function umount(dir: string) {
    await new Deno.Command("umount", { args: [dir] }).output().catch(() => {});
  }

  it("read-only output folder: exit 1, one line, the old outputs intact", async () => {
    const mnt = await mountTmpfs(4096);
    if (!mnt) {
      console.log("cannot mount a tmpfs here (needs root): read-only case skipped");
      return;
    }
    try {
      const lot = await lotOf(3);
      expect((await runMeasured(PERMS, ["batch", lot, "--out", mnt, "--quiet"])).code).toBe(0);
      const before = await outputsOf(mnt);
      await Deno.writeTextFile(`${lot}/extra.csv`, variant(await Deno.readTextFile(FIXTURE), 7));
      await new Deno.Command("mount", { args: ["-o", "remount,ro", mnt] }).output();
      const r = await runMeasured(PERMS, ["batch", lot, "--out", mnt, "--quiet"]);
      expect(r.code).toBe(1);
      expect(r.stderr.trim().split("\n").length).toBe(1);
      expect(r.stderr).toMatch(
        new RegExp(`crystint batch: ${mnt}.*: cannot write: .*Read-only file system`),
      );
      expect(await outputsOf(mnt)).toEqual(before);
    } finally {
      await umount(mnt);
    }
  });

  it("disk full while writing: the old outputs intact or all new ones present, never a mix; no temporaries left", async () => {
    const mnt = await mountTmpfs(1200);
    if (!mnt) {
      console.log("cannot mount a tmpfs here (needs root): disk-full case skipped");
      return;
    }
    try {
      const lot = await lotOf(3);
      expect((await runMeasured(PERMS, ["batch", lot, "--out", mnt, "--quiet"])).code).toBe(0);
      const before = await outputsOf(mnt);
      const base = await Deno.readTextFile(FIXTURE);
      let full = false;
      for (let step = 0; step < 6 && !full; step++) {
        for (let i = 0; i < 15; i++) {
          await Deno.writeTextFile(
            `${lot}/more-${step}-${i}.csv`,
            variant(base, 10 + step * 15 + i),
          );
        }
        const r = await runMeasured(PERMS, ["batch", lot, "--out", mnt, "--quiet"]);
        const now = await outputsOf(mnt);
        if (r.code === 1) {
          full = true;
          expect(r.stderr.trim().split("\n").length).toBe(1);
          expect(r.stderr).toMatch(/cannot write: .*No space left on device/);
          expect(now).toEqual(before);
        } else {
          expect(r.code).toBe(0);
          const samples = JSON.parse(now[0]!).samples.length;
          expect(now[1]!.trim().split("\n").length).toBe(1 + samples * 4);
          expect(now[2]).toContain(`more-${step}-14`);
          before.splice(0, 3, ...now);
        }
        const temps = [...Deno.readDirSync(mnt), ...Deno.readDirSync(`${mnt}/.cache`)]
          .filter((e) => e.name.startsWith(".crystint-tmp"));
        expect(temps.map((e) => e.name)).toEqual([]);
      }
      expect(full).toBe(true);
    } finally {
      await umount(mnt);
    }
  });
});

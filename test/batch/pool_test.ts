import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT } from "../_run_cli.ts";
import { WorkerPool } from "../../lib/batch/pool.ts";
import { settingsForSample } from "../../lib/batch/sample_settings_from_sheet.ts";
import { resolveSettings } from "../../lib/batch/settings_schema.ts";
import { wideExport } from "./_hostile.ts";

describe("worker pool isolation (issue 16 item 2)", () => {
  it("a job past its time budget fails alone; its worker is replaced and the next job on the same one-worker pool succeeds", async () => {
    const base = await Deno.readTextFile(`${ROOT}test/fixtures/colour/cr_corundum_5nm.csv`);
    const settings = settingsForSample(resolveSettings({ ordinate: "transmittance" }), undefined);
    const pool = new WorkerPool(1, { timeoutMs: 5000 });
    try {
      const enc = new TextEncoder();
      const started = Date.now();
      // 16,000 spectra: tens of seconds of work (500 take about a second on this machine)
      const slow = pool.run("wide.csv", enc.encode(wideExport(base, 16000)), settings);
      const next = pool.run("good.csv", enc.encode(base), settings);
      const a = await slow;
      expect(a.ok).toBe(false);
      if (!a.ok) {
        expect(a.error.message).toBe("wide.csv: analysis took longer than 5 s (stopped)");
      }
      expect(Date.now() - started).toBeLessThan(20000);
      const b = await next;
      expect(b.ok ? "ok" : b.error.message).toBe("ok");
      if (b.ok) expect(JSON.parse(b.json).length).toBe(b.count);
      expect(pool.replaced).toBe(1);
    } finally {
      pool.close();
    }
  });
});

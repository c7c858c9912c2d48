/**
 * Reads which response metric a standards table's response column holds from its header, e.g.
 * `band height (cm-1) @ 555 nm`, `alpha at 555 nm (cm-1)`, `band area (cm-2) @ 18000 cm-1`.
 *
 * @module
 */
import { HC_EV_NM, wavenumberToNm } from "../spectrum/axis.ts";
import type { MetricOptions, ResponseMetric } from "./response_metric.ts";

/** A response column's meaning, as its header states it. */
export interface ResponseHeader {
  /** The metric, or undefined when the header names none (a bare "response"). */
  metric?: ResponseMetric;
  /** Band centre or wavelength the header names. */
  options: MetricOptions;
  /** Unit in brackets, e.g. `cm-1`. */
  unit?: string;
  /** Base of the α scale when the header says (`decadic`, `log10`, `alpha10`): 10, else e. */
  alphaBase: "e" | "10";
}

/** Position in nm from `555 nm`, `18000 cm-1` or `2.23 eV`. */
function positionNm(value: string, unit: string): number {
  const v = Number(value.replace(",", "."));
  const u = unit.toLowerCase();
  if (u === "nm") return v;
  if (u.startsWith("cm")) return wavenumberToNm(v);
  return HC_EV_NM / v; // eV: λ = hc / E (CODATA 2018)
}

/** Whether a header cell names a response column (of any metric). */
export function isResponseHeader(header: string): boolean {
  return /^\s*(response|band\s*(height|area|intensity)|alpha|α|absorption\s+coefficient)\b/i
    .test(header);
}

/** The metric, position and unit a response header states. */
export function readResponseHeader(header: string): ResponseHeader {
  const h = header.trim();
  const out: ResponseHeader = { options: {}, alphaBase: "e" };
  if (/^band\s*area/i.test(h)) out.metric = "band-area";
  else if (/^band\s*(height|intensity)/i.test(h)) out.metric = "band-height";
  else if (/^(alpha|α|absorption\s+coefficient)\b/i.test(h)) out.metric = "alpha-at";
  const unit = /[([]\s*([^)\]]+?)\s*[)\]]/.exec(h);
  if (unit) out.unit = unit[1]!;
  const at = /(?:@|\bat\b|\bnear\b)\s*([\d.,]+)\s*(nm|cm-1|cm⁻¹|ev)/i.exec(h);
  if (at && out.metric) {
    const nm = positionNm(at[1]!, at[2]!);
    if (out.metric === "alpha-at") out.options.atNm = nm;
    else out.options.bandNm = nm;
  }
  if (/decadic|log10|alpha10|α10|base\s*10/i.test(h)) out.alphaBase = "10";
  return out;
}

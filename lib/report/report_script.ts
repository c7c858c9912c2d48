/**
 * The report's own browser script (runs after the inlined chart.js). It reads the embedded
 * JSON, sorts the summary table, draws the lot charts, and renders one sample's detail on
 * demand. User strings only ever reach the page through textContent.
 */
export const REPORT_SCRIPT = `
(function () {
  "use strict";
  var data = JSON.parse(document.getElementById("crystint-data").textContent);
  var DAY = "#2c6e73", LAMP = "#b5651d", INK = "#1e2a32", RULE = "#d9d2c3";
  Chart.defaults.animation = false;
  Chart.defaults.font.family = "'Source Sans 3', 'Segoe UI', system-ui, sans-serif";
  Chart.defaults.color = "#5d6b73";
  Chart.defaults.maintainAspectRatio = false;

  // Arrows in the a*b* plane: pairs [a1, b1, a2, b2] drawn as lines with heads.
  Chart.register({
    id: "abArrows",
    afterDatasetsDraw: function (chart) {
      var opts = chart.options.plugins.abArrows;
      if (!opts || !opts.pairs) return;
      var ctx = chart.ctx, xs = chart.scales.x, ys = chart.scales.y;
      ctx.save();
      ctx.lineWidth = 1.4;
      opts.pairs.forEach(function (p) {
        var x1 = xs.getPixelForValue(p[0]), y1 = ys.getPixelForValue(p[1]);
        var x2 = xs.getPixelForValue(p[2]), y2 = ys.getPixelForValue(p[3]);
        ctx.strokeStyle = p[4] || INK;
        ctx.fillStyle = p[4] || INK;
        ctx.beginPath(); ctx.moveTo(x1, y1); ctx.lineTo(x2, y2); ctx.stroke();
        var ang = Math.atan2(y2 - y1, x2 - x1), h = 7;
        ctx.beginPath(); ctx.moveTo(x2, y2);
        ctx.lineTo(x2 - h * Math.cos(ang - 0.4), y2 - h * Math.sin(ang - 0.4));
        ctx.lineTo(x2 - h * Math.cos(ang + 0.4), y2 - h * Math.sin(ang + 0.4));
        ctx.closePath(); ctx.fill();
        if (p[5]) { ctx.font = "600 12px sans-serif"; ctx.fillText(String(p[5]), x2 + 6, y2 - 6); }
      });
      ctx.restore();
    }
  });

  // the same as roundTo (lib/numeric/round.ts), axisValues and curveValues
  // (lib/analysis/chart_curves.ts)
  function curveValues(c) {
    if (Array.isArray(c)) return c;
    var k = c.d || textToIntegers(c.text), times = c.d ? 1 : c.order;
    for (var t = 0; t < times; t++) {
      var sum = 0;
      k = k.map(function (x) { return sum += x; });
    }
    return k.map(function (x) { return x / c.q; });
  }
  // the same as textToIntegers (lib/numeric/step_text.ts)
  var STEP_ALPHABET = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_";
  function textToIntegers(text) {
    var width = STEP_ALPHABET.indexOf(text[0]), total = 6 * (text.length - 1), at = 0, out = [];
    function take(bits) {
      var v = 0;
      for (var b = 0; b < bits; b++, at++) {
        v = 2 * v + ((STEP_ALPHABET.indexOf(text[1 + Math.floor(at / 6)]) >> (5 - (at % 6))) & 1);
      }
      return v;
    }
    var escape = Math.pow(2, width) - 1;
    while (width > 0 && total - at >= width) {
      var z = take(width);
      if (z === escape) {
        if (total - at < 6) break;
        z += take(take(6));
      }
      out.push(z % 2 === 0 ? z / 2 : -(z + 1) / 2);
    }
    return out;
  }
  function roundTo(v, decimals) { return typeof v === "number" && isFinite(v) ? Number(v.toFixed(decimals)) : NaN; }
  function axisValues(axis) {
    if (Array.isArray(axis)) return axis;
    var out = [];
    for (var i = 0; i < axis.count; i++) out.push(roundTo(axis.from + i * axis.step, 2));
    return out;
  }

  var OBS = data.xyObserver || "2";
  function locusDataset() {
    var locus = data.loci[OBS];
    if (!locus) return null;
    var pts = locus.x.map(function (x, i) { return { x: x, y: locus.y[i] }; });
    pts.push(pts[0]);
    return { label: "spectral locus (" + OBS + "° observer)", data: pts, showLine: true, pointRadius: 0,
      borderColor: INK, borderWidth: 1.2, fill: false };
  }
  function lightColor(ill) { return ill === FROM ? DAY : ill === TO ? LAMP : "#7b5ea7"; }
  var FIRST = data.rows[0], FROM = FIRST ? FIRST.from : "D65", TO = FIRST ? FIRST.to : "A";
  // points: {illuminant, observer, x, y, wx, wy, sample?}; only the chosen observer is drawn
  function xyChart(canvas, points) {
    var byIll = {}, whites = {};
    points.forEach(function (p) {
      if (p.observer !== OBS) return;
      (byIll[p.illuminant] = byIll[p.illuminant] || []).push({ x: p.x, y: p.y, name: p.sample || "" });
      whites[p.illuminant] = [p.wx, p.wy];
    });
    var sets = [], locus = locusDataset();
    if (locus) sets.push(locus);
    Object.keys(byIll).forEach(function (ill) {
      sets.push({ label: "under " + ill, data: byIll[ill], pointRadius: 3.5, backgroundColor: lightColor(ill) });
      sets.push({ label: ill + " white", data: [{ x: whites[ill][0], y: whites[ill][1] }],
        pointStyle: "crossRot", pointRadius: 7, borderColor: lightColor(ill), borderWidth: 2 });
    });
    return new Chart(canvas, { type: "scatter", data: { datasets: sets },
      options: { scales: { x: { min: 0, max: 0.8, title: { display: true, text: OBS === "10" ? "x10" : "x" } },
        y: { min: 0, max: 0.9, title: { display: true, text: OBS === "10" ? "y10" : "y" } } },
        plugins: { legend: { position: "bottom" }, tooltip: { callbacks: { label: function (c) {
          var r = c.raw || {};
          return (r.name ? r.name + ": " : "") + c.dataset.label + " x " + Number(r.x).toFixed(4) + ", y " + Number(r.y).toFixed(4);
        } } } } } });
  }
  function limitFor(pairs) {
    var lim = 10;
    pairs.forEach(function (p) { lim = Math.max(lim, Math.abs(p[0]), Math.abs(p[1]), Math.abs(p[2]), Math.abs(p[3])); });
    return Math.ceil(lim / 10) * 10;
  }
  // pairs: [a1, b1, a2, b2, name]; lot: draw arrows only for highlighted pairs, the rest as faint points
  // ellipses: [{ points: [[a, b], …], color }] drawn as dashed lines (95 % coverage regions)
  function abChart(canvas, pairs, from, to, lot, ellipses) {
    var lim = limitFor(pairs), faint = lot ? "55" : "";
    (ellipses || []).forEach(function (el) {
      el.points.forEach(function (p) { lim = Math.max(lim, Math.ceil(Math.abs(p[0]) / 10) * 10, Math.ceil(Math.abs(p[1]) / 10) * 10); });
    });
    var sets = [
      { label: "under " + from, data: pairs.map(function (p) { return { x: p[0], y: p[1], name: p[4] }; }), backgroundColor: DAY + faint, pointRadius: lot ? 3 : 3.5 },
      { label: "under " + to, data: pairs.map(function (p) { return { x: p[2], y: p[3], name: p[4] }; }), backgroundColor: LAMP + faint, pointRadius: lot ? 3 : 3.5 }
    ];
    (ellipses || []).forEach(function (el) {
      sets.push({ label: el.label, data: el.points.map(function (p) { return { x: p[0], y: p[1] }; }),
        showLine: true, pointRadius: 0, borderColor: el.color, borderWidth: 1, borderDash: [3, 2] });
    });
    var chart = new Chart(canvas, { type: "scatter",
      data: { datasets: sets },
      options: { scales: { x: { min: -lim, max: lim, title: { display: true, text: "a*" }, grid: { color: RULE } },
        y: { min: -lim, max: lim, title: { display: true, text: "b*" }, grid: { color: RULE } } },
        onHover: lot ? function (ev, els) { setHover(els.length ? els[0].index : null); } : undefined,
        plugins: { legend: { position: "bottom" }, tooltip: { callbacks: { label: function (c) {
          var r = c.raw || {};
          return (r.name ? r.name + ": " : "") + c.dataset.label + " a* " + Number(r.x).toFixed(1) + ", b* " + Number(r.y).toFixed(1);
        } } }, abArrows: { pairs: lot ? [] : pairs.map(function (p) { return p.slice(0, 4).concat([INK]); }) } } } });
    chart.$pairs = pairs;
    return chart;
  }
  var lotAb = null, selected = null, hovered = null;
  function redrawLot() {
    if (!lotAb) return;
    var show = [];
    if (selected !== null) show.push([selected, INK]);
    if (hovered !== null && hovered !== selected) show.push([hovered, LAMP]);
    lotAb.options.plugins.abArrows.pairs = show.map(function (s) {
      var p = lotAb.$pairs[s[0]]; return p ? p.slice(0, 4).concat([s[1], p[4]]) : null;
    }).filter(Boolean);
    lotAb.update("none");
  }
  function setHover(i) { if (i !== hovered) { hovered = i; redrawLot(); } }

  // Summary table sorting: by a cell's data-value, or its text where the two are the same.
  var table = document.getElementById("summary");
  function sortValue(cell) {
    var v = cell.getAttribute("data-value");
    return v === null ? cell.textContent.trim() : v;
  }

  // A long table shows one page of the rows the filter leaves, in the sorted order.
  var PAGE = table ? Number(table.getAttribute("data-page-rows")) || 0 : 0, page = 0;
  var prevPage = document.querySelectorAll(".page-prev"), nextPage = document.querySelectorAll(".page-next");
  function paginate() {
    if (!PAGE) return;
    var rows = table.tBodies[0].rows, n = 0, k = 0, i;
    for (i = 0; i < rows.length; i++) if (!rows[i].hidden) n++;
    var pages = Math.max(1, Math.ceil(n / PAGE));
    if (page > pages - 1) page = pages - 1;
    var lo = page * PAGE, hi = lo + PAGE;
    for (i = 0; i < rows.length; i++) {
      if (rows[i].hidden) { rows[i].classList.remove("off-page"); continue; }
      rows[i].classList.toggle("off-page", k < lo || k >= hi);
      k++;
    }
    var info = n ? "rows " + (lo + 1) + "–" + Math.min(hi, n) + " of " + n : "no rows";
    document.querySelectorAll(".page-info").forEach(function (el) { el.textContent = info; });
    prevPage.forEach(function (b) { b.disabled = page === 0; });
    nextPage.forEach(function (b) { b.disabled = page >= pages - 1; });
  }
  if (PAGE) {
    prevPage.forEach(function (b) { b.addEventListener("click", function () { page--; paginate(); }); });
    nextPage.forEach(function (b) {
      b.addEventListener("click", function () {
        page++;
        paginate();
        // from the buttons under the table, the new page is read from its top
        if (b.closest(".table-box + .tools")) table.scrollIntoView();
      });
    });
  }
  if (table) {
    table.querySelectorAll("th[data-key]").forEach(function (th) {
      th.addEventListener("click", function () {
        var dir = th.getAttribute("aria-sort") === "ascending" ? "descending" : "ascending";
        table.querySelectorAll("th").forEach(function (o) { o.removeAttribute("aria-sort"); });
        th.setAttribute("aria-sort", dir);
        var body = table.tBodies[0];
        var idx = Array.prototype.indexOf.call(th.parentNode.children, th);
        // each row's key read once, then sorted (not read again in every comparison)
        var rows = Array.prototype.map.call(body.rows, function (tr) { return { tr: tr, key: sortValue(tr.cells[idx]) }; });
        rows.sort(function (a, b) {
          var va = a.key, vb = b.key;
          if (va === "" || vb === "") return va === vb ? 0 : va === "" ? 1 : -1;
          var na = Number(va), nb = Number(vb), r;
          r = (!isNaN(na) && !isNaN(nb)) ? na - nb : String(va).localeCompare(String(vb), undefined, { numeric: true });
          return dir === "ascending" ? r : -r;
        });
        rows.forEach(function (r) { body.appendChild(r.tr); });
        page = 0;
        paginate();
      });
    });
  }

  // Filter: rows whose text holds every word typed.
  var filter = document.getElementById("filter");
  if (filter && table) {
    filter.addEventListener("input", function () {
      var words = filter.value.toLowerCase().split(/\s+/).filter(Boolean), shown = 0;
      Array.prototype.forEach.call(table.tBodies[0].rows, function (tr) {
        var text = tr.textContent.toLowerCase();
        var ok = words.every(function (w) { return text.indexOf(w) >= 0; });
        tr.hidden = !ok;
        if (ok) shown++;
      });
      var c = document.getElementById("filter-count");
      if (c) c.textContent = shown + " of " + table.tBodies[0].rows.length + " shown";
      page = 0;
      paginate();
    });
  }

  // Lot overview.
  var allXy = [], allPairs = [], pairIndex = {};
  data.rows.forEach(function (row) {
    var d = data.details[row.index];
    if (!d) return;
    d.xy.forEach(function (p) { allXy.push({ illuminant: p.illuminant, observer: p.observer, x: p.x, y: p.y, wx: p.wx, wy: p.wy, sample: d.sample }); });
    pairIndex[row.index] = allPairs.length;
    allPairs.push([d.abFrom[0], d.abFrom[1], d.abTo[0], d.abTo[1], d.sample]);
  });
  if (document.getElementById("xy-all")) xyChart(document.getElementById("xy-all"), allXy);
  if (document.getElementById("ab-all")) lotAb = abChart(document.getElementById("ab-all"), allPairs, FROM, TO, true);
  if (table) {
    table.tBodies[0].addEventListener("mouseover", function (ev) {
      var tr = ev.target.closest ? ev.target.closest("tr") : null;
      if (tr) { var i = pairIndex[tr.getAttribute("data-index")]; setHover(i === undefined ? null : i); }
    });
    table.tBodies[0].addEventListener("mouseleave", function () { setHover(null); });
  }

  // Calibration plots: standards, the fitted line, and the samples placed on it.
  (data.calibrations || []).forEach(function (c, i) {
    var canvas = document.getElementById("chart-cal-" + i);
    if (!canvas) return;
    var xs = c.standards.map(function (p) { return p.x; }).concat(c.samples.map(function (p) { return p.x; }));
    var lo = Math.min.apply(null, xs.concat([0])), hi = Math.max.apply(null, xs);
    new Chart(canvas, { type: "scatter", data: { datasets: [
      { label: "standards", data: c.standards.map(function (p) { return { x: p.x, y: p.y }; }), backgroundColor: INK, pointRadius: 5 },
      { label: "fit", data: [{ x: lo, y: c.intercept + c.slope * lo }, { x: hi, y: c.intercept + c.slope * hi }],
        showLine: true, pointRadius: 0, borderColor: DAY },
      { label: "samples", data: c.samples.map(function (p) { return { x: p.x, y: p.y }; }), backgroundColor: LAMP, pointRadius: 3.5 }
    ] }, options: { scales: { x: { title: { display: true, text: "concentration (" + c.unit + ")" } },
      y: { title: { display: true, text: c.metric } } }, plugins: { legend: { position: "bottom" } } } });
  });

  // Detail on demand.
  var charts = [];
  function text(id, value) { var el = document.getElementById(id); if (el) el.textContent = value; }
  function showDetail(index) {
    var d = data.details[index], row = data.rows.filter(function (r) { return r.index === index; })[0];
    selected = pairIndex[index] === undefined ? null : pairIndex[index];
    redrawLot();
    var box = document.getElementById("detail");
    if (!d || !row || !box) return;
    charts.forEach(function (c) { c.destroy(); }); charts = [];
    box.hidden = false;
    document.querySelectorAll("#summary tbody tr").forEach(function (tr) {
      tr.classList.toggle("open", tr.getAttribute("data-index") === String(index));
    });
    text("detail-name", d.sample);
    text("detail-file", d.file);
    var facts = document.getElementById("detail-facts");
    facts.textContent = "";
    function fact(k, v) {
      var dt = document.createElement("dt"); dt.textContent = k;
      var dd = document.createElement("dd"); dd.textContent = v;
      facts.appendChild(dt); facts.appendChild(dd);
    }
    fact("path for colour", row.pathMm === null ? "as measured" : row.pathMm + " mm");
    fact("measured thickness", d.thicknessMm === null ? "not given" : d.thicknessMm + " mm");
    if (d.polarisation) fact("polarisation", d.polarisation);
    if (d.host) fact("host", d.host);
    function pm(v, sd) { return sd === null || sd === undefined ? String(v) : v + " ± " + sd; }
    d.color.forEach(function (c) {
      var u = c.sd || {};
      fact(c.illuminant + " / " + c.observer + "°", "L* " + pm(c.L, u.L) + "  C* " + pm(c.C, u.C) + "  h " + pm(c.h, u.h) + "°" +
        (c.dominantNm === null ? "" : "  λ" + (c.complementary ? "c " : "d ") + c.dominantNm + " nm, pe " + c.purity));
    });
    fact("change " + row.from + " → " + row.to, "ΔE00 " + pm(row.dE00, row.dE00Sd) + ", Δh " + row.dh + "°");
    if (row.target) fact("target " + row.target.name, (row.target.pass ? "pass" : "fail") + " (ΔE00 " + row.target.dE00 + "; " + row.target.words + ")");
    if (row.target && row.target.verdict) fact("verdict with uncertainty", row.target.verdict +
      (row.target.passProbability === undefined ? "" : " (probability of passing " + (100 * row.target.passProbability).toFixed(1) + " %)"));
    Object.keys(d.extra || {}).forEach(function (k) { if (d.extra[k]) fact(k, d.extra[k]); });
    if (row.notes) fact("notes", row.notes);
    row.warnings.forEach(function (w) { fact("note", w); });
    document.getElementById("detail-swatch-from").style.background = row.swatchFrom;
    document.getElementById("detail-swatch-to").style.background = row.swatchTo;

    var spec = [{ label: "T at " + (row.pathMm === null ? "measured path" : row.pathMm + " mm"),
      data: (function (t) { return axisValues(d.plot.nm).map(function (x, i) { return { x: x, y: t[i] }; }); })(curveValues(d.plot.t)),
      showLine: true, pointRadius: 0, borderColor: INK, borderWidth: 1.5 }];
    var specScales = { x: { type: "linear", title: { display: true, text: "wavelength (nm)" } },
      y: { min: 0, max: 1, title: { display: true, text: "transmittance" } } };
    charts.push(new Chart(document.getElementById("chart-spectrum"), { type: "scatter", data: { datasets: spec },
      options: { scales: specScales, plugins: { legend: { position: "bottom" } } } }));
    var bc = document.getElementById("chart-bands"), bt = document.getElementById("bands-table");
    bt.textContent = "";
    if (d.bands) {
      bc.parentNode.parentNode.hidden = false;
      var bandNm = axisValues(d.bands.nm);
      var bandData = curveValues(d.bands.data), bandModel = curveValues(d.bands.model);
      var residual = bandData.map(function (v, i) {
        var m = bandModel[i];
        return typeof v === "number" && typeof m === "number" && isFinite(v) && isFinite(m) ? roundTo(v - m, 5) : null;
      });
      function pts(arr) { return bandNm.map(function (x, i) { return { x: x, y: arr[i] }; }); }
      charts.push(new Chart(bc, { type: "scatter", data: { datasets: [
        { label: "measured " + d.bands.ordinate, data: pts(bandData), showLine: true, pointRadius: 0, borderColor: INK, borderWidth: 1.2 },
        { label: "fit (bands + baseline)", data: pts(bandModel), showLine: true, pointRadius: 0, borderColor: LAMP, borderDash: [5, 3] },
        { label: "residual", data: pts(residual), showLine: true, pointRadius: 0, borderColor: "#9aa5ab", yAxisID: "y2" }
      ] }, options: { scales: { x: { type: "linear", title: { display: true, text: "wavelength (nm)" } },
        y: { title: { display: true, text: d.bands.ordinate } },
        y2: { position: "right", title: { display: true, text: "residual" }, grid: { display: false } } },
        plugins: { legend: { position: "bottom" } } } }));
      d.bands.table.forEach(function (b) {
        var tr = document.createElement("tr");
        [b.centerNm + " ± " + b.centerNmSigma + " nm", b.fwhmCm1 + " cm⁻¹", String(b.height), b.assignment].forEach(function (v) {
          var td = document.createElement("td"); td.textContent = v; tr.appendChild(td);
        });
        bt.appendChild(tr);
      });
    } else {
      bc.parentNode.parentNode.hidden = true;
    }
    charts.push(xyChart(document.getElementById("chart-xy"), d.xy));
    var ellipses = [];
    if (d.ellipseFrom) ellipses.push({ points: d.ellipseFrom, color: DAY, label: "95 % region, " + row.from });
    if (d.ellipseTo) ellipses.push({ points: d.ellipseTo, color: LAMP, label: "95 % region, " + row.to });
    charts.push(abChart(document.getElementById("chart-ab"), [[d.abFrom[0], d.abFrom[1], d.abTo[0], d.abTo[1]]], row.from, row.to, false, ellipses));
    var sc = document.getElementById("chart-series");
    if (d.series) {
      sc.parentNode.hidden = false;
      charts.push(new Chart(sc, { type: "scatter", data: { datasets: [
        { label: "L*", data: d.series.pathMm.map(function (x, i) { return { x: x, y: d.series.L[i] }; }), showLine: true,
          borderColor: INK, pointBackgroundColor: d.series.srgb, pointRadius: 5 },
        { label: "C*ab", data: d.series.pathMm.map(function (x, i) { return { x: x, y: d.series.C[i] }; }), showLine: true,
          borderColor: DAY, borderDash: [4, 3], pointRadius: 0 }
      ] }, options: { scales: { x: { title: { display: true, text: "path length (mm)" } }, y: { min: 0, max: 100 } },
        plugins: { legend: { position: "bottom" } } } }));
      text("series-note", d.series.maxChromaAtRangeEnd
        ? "Chroma is largest at the end of the range computed (" + d.series.maxChromaPathMm + " mm, " + row.from + "), not at a maximum."
        : "Maximum chroma at " + d.series.maxChromaPathMm + " mm (" + row.from + ").");
    } else {
      sc.parentNode.hidden = true;
      text("series-note", "No thickness is known for this sample, so no thickness series.");
    }
  }
  document.querySelectorAll("button.detail").forEach(function (b) {
    b.addEventListener("click", function () { showDetail(Number(b.getAttribute("data-index"))); });
  });
  window.crystintShowDetail = showDetail;
  if (FIRST && data.details[FIRST.index]) showDetail(FIRST.index);
})();
`;

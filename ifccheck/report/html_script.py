# ruff: noqa: E501  (the embedded script is JavaScript, not Python)
"""The check report's one script: unpacks the embedded data, then pages, sorts and
filters the beam table, zooms and pans the plans (placing their labels again at each
zoom), shows hover texts, and renders a beam's details when it is opened.

Without it the page still shows the summary, the caution, the design basis, the plans
as drawn, the first page of the table and the not-checked beams. The service allows it
by its hash (:data:`ifccheck.report.html_out.TABLE_SCRIPT_HASH`).
"""

from __future__ import annotations

REPORT_SCRIPT = r"""
(() => {
"use strict";
const root = document.documentElement;
const block = document.getElementById("report-data");
if (!block) { root.dataset.ready = "no-data"; return; }
const esc = (s) => String(s).replace(/[&<>"']/g, (c) => ({"&": "&amp;", "<": "&lt;",
  ">": "&gt;", '"': "&quot;", "'": "&#39;"}[c]));
const OUTCOMES = ["pass", "fail", "not_checked"];
const BANDS = [[0.5, "#94dee0"], [0.75, "#2cb5c9"], [0.9, "#0088b7"], [1.0, "#005798"]];
const FAIL = "#ed492c", GREY = "#969696";
const colour = (u) => u === null ? GREY : (BANDS.find((b) => u <= b[0]) || [0, FAIL])[1];
function utext(u) {
  if (u === null || u === undefined) return "–";
  if (u > 0.99 && u < 1.01) return (Math.ceil(u * 1000 - 1e-9) / 1000).toFixed(3);
  return (Math.ceil(u * 100 - 1e-9) / 100).toFixed(2);
}
const ucell = (u) => u === null || u === undefined ? '<td class="num">–</td>' :
  '<td class="num utilisation"><span class="swatch" style="background:' + colour(u) +
  '"></span>' + utext(u) + "</td>";
const outcome = (o) => '<span class="outcome outcome-' + o + '">' + o.replace("_", " ") +
  "</span>";
function table(head, rows, cls, marked) {
  let h = '<table class="' + (cls || "") + '">';
  if (head) h += "<thead><tr>" + head.map((x) => "<th>" + esc(x) + "</th>").join("") +
    "</tr></thead>";
  h += "<tbody>" + rows.map((r, i) => (i === marked ? '<tr class="governing">' : "<tr>") +
    r.map((c) => typeof c === "object" && c !== null ? c.html :
      "<td>" + esc(c) + "</td>").join("") + "</tr>").join("") + "</tbody></table>";
  return h;
}
const num = (s) => ({html: '<td class="num">' + esc(s) + "</td>"});
const raw = (html) => ({html: html});

async function unpack() {
  const bin = atob(block.textContent.trim());
  const bytes = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  const stream = new Blob([bytes]).stream().pipeThrough(new DecompressionStream("gzip"));
  return JSON.parse(await new Response(stream).text());
}

function start(D) {
  performance.mark("ifccheck-unpacked");
  const beams = D.beams, U = D.units, byGuid = new Map();
  for (const b of beams) byGuid.set(b.g, b);
  const ref = (g) => D.names[g] && D.names[g] !== g ? D.names[g] + " (" + g + ")" : g;
  const endWords = (b, i) => b.d.ends[i] ? "the end at " + b.d.ends[i] :
    "the free " + (i ? "end" : "start");
  function stationText(b, x) {
    const len = b.d.len, L = " " + U.length;
    if (x < 0) return (-x).toFixed(2) + L + " beyond " + endWords(b, 0);
    if (x > len) return (x - len).toFixed(2) + L + " beyond " + endWords(b, 1);
    const atStart = x <= len / 2;
    return (atStart ? x : len - x).toFixed(2) + L + " from " + endWords(b, atStart ? 0 : 1);
  }
  function tooltip(b) {
    const parts = [b.n || b.g, b.p, OUTCOMES[b.o].replace("_", " ")];
    if (b.u !== null) parts.push("utilisation " + utext(b.u));
    if (b.lb !== null) parts.push("Lb " + (b.lb === 0 ? "continuous (slab)" : b.lbt + " " + U.length));
    if (b.r) parts.push(b.r);
    let s = parts.filter((p) => p).join(" · ");
    for (const r of b.d.braces || []) {
      s += "\n" + r[2] + " brace at " + stationText(b, r[0]) + " by " + ref(r[4]) +
        (r[1] ? "" : "; does not count: " + (r[6] || "no reason recorded"));
    }
    return s;
  }

  // --- the beam table ---------------------------------------------------------
  const tableEl = document.getElementById("beam-table");
  const form = document.getElementById("beam-filters");
  const pager = document.getElementById("beam-pager");
  const PAGE = 50;
  const st = {storey: "", outcome: "", q: "", key: null, dir: 1, page: 0};
  let order = beams.slice();
  let shown = order;
  const sortValue = {
    name: (b) => (b.n || "").toLowerCase(), storey: (b) => D.storeys[b.s].toLowerCase(),
    profile: (b) => (b.p || "").toLowerCase(), outcome: (b) => OUTCOMES[b.o],
    utilisation: (b) => b.u === null ? -Infinity : b.u, lb: (b) => b.lb === null ? -Infinity : b.lb,
    guid: (b) => b.g.toLowerCase(), stage: (b) => b.st,
  };
  function row(b) {
    const cells = [
      '<td><a href="#beam-' + esc(b.g) + '">' + esc(b.n || b.g) + "</a></td>",
      "<td>" + esc(D.storeys[b.s]) + "</td>", "<td>" + esc(b.p) + "</td>",
      "<td>" + outcome(OUTCOMES[b.o]) + "</td>", ucell(b.u), "<td>" + esc(b.cl) + "</td>",
    ];
    if (D.staged) cells.push("<td>" + esc(b.st) + "</td>");
    cells.push('<td class="num">' + esc(b.lbt) + "</td>", '<td class="num">' + esc(b.cb) + "</td>",
      '<td class="num">' + esc(b.m) + "</td>", '<td class="num">' + esc(b.c) + "</td>",
      '<td class="guid"><code>' + esc(b.g) + "</code></td>");
    return '<tr data-guid="' + esc(b.g) + '" data-name="' + esc(b.n) + '" data-storey="' +
      esc(D.storeys[b.s]) + '" data-outcome="' + OUTCOMES[b.o] + '" data-profile="' + esc(b.p) +
      '" data-stage="' + esc(b.st) + '">' + cells.join("") + "</tr>";
  }
  function renderTable() {
    const pages = Math.max(1, Math.ceil(shown.length / PAGE));
    st.page = Math.min(Math.max(st.page, 0), pages - 1);
    const part = shown.slice(st.page * PAGE, (st.page + 1) * PAGE);
    tableEl.tBodies[0].innerHTML = part.map(row).join("");
    document.getElementById("beam-count").textContent = shown.length + " of " + beams.length +
      " beams";
    document.getElementById("page-text").textContent = "page " + (st.page + 1) + " of " + pages;
    document.getElementById("page-prev").disabled = st.page === 0;
    document.getElementById("page-next").disabled = st.page >= pages - 1;
  }
  function applyFilters() {
    const storey = st.storey === "" ? -1 : D.storeys.indexOf(st.storey);
    const o = st.outcome === "" ? -1 : OUTCOMES.indexOf(st.outcome), q = st.q;
    shown = order.filter((b) => (storey < 0 || b.s === storey) && (o < 0 || b.o === o) &&
      (!q || [b.n, b.g, b.p].some((v) => (v || "").toLowerCase().includes(q))));
    st.page = 0;
    renderTable();
  }
  if (tableEl && form) {
    form.hidden = false;
    pager.hidden = false;
    form.addEventListener("submit", (e) => e.preventDefault());
    const storey = document.getElementById("filter-storey");
    const outcomeSel = document.getElementById("filter-outcome");
    const text = document.getElementById("filter-text");
    storey.addEventListener("change", () => { st.storey = storey.value; applyFilters(); });
    outcomeSel.addEventListener("change", () => { st.outcome = outcomeSel.value; applyFilters(); });
    text.addEventListener("input", () => { st.q = text.value.trim().toLowerCase(); applyFilters(); });
    document.getElementById("page-prev").addEventListener("click", () => { st.page--; renderTable(); });
    document.getElementById("page-next").addEventListener("click", () => { st.page++; renderTable(); });
    for (const button of tableEl.querySelectorAll("button.sort")) {
      button.addEventListener("click", () => {
        st.dir = st.key === button.dataset.key ? -st.dir : 1;
        st.key = button.dataset.key;
        const value = sortValue[st.key];
        order = beams.slice().sort((a, b) => {
          const x = value(a), y = value(b);
          return (x < y ? -1 : x > y ? 1 : 0) * st.dir;
        });
        for (const th of tableEl.tHead.rows[0].cells) th.removeAttribute("aria-sort");
        button.parentElement.setAttribute("aria-sort", st.dir > 0 ? "ascending" : "descending");
        applyFilters();
      });
    }
    applyFilters();
  }
  performance.mark("ifccheck-table");

  // --- plans: hover, select, zoom and pan, labels placed again at each zoom -----
  const tip = document.getElementById("plan-tip");
  const CH = 6.6, LH = 14, CELL = 64;
  function boxOf(x, y, anchor, w) {
    const left = anchor === "middle" ? x - w / 2 : anchor === "start" ? x : x - w;
    return [left, y - 11, left + w, y + LH - 11];
  }
  function candidates(x0, y0, x1, y1, w, W, H) {
    const out = [];
    for (const t of [0.5, 0.25, 0.75]) {
      const mx = x0 + t * (x1 - x0), my = y0 + t * (y1 - y0);
      const clampY = (y) => Math.min(Math.max(y, 12), H - 4);
      if (Math.abs(x1 - x0) >= Math.abs(y1 - y0)) {
        const x = Math.min(Math.max(mx, w / 2 + 2), W - w / 2 - 2);
        out.push([x, clampY(my - 7), "middle"], [x, clampY(my + 15), "middle"]);
      } else {
        if (mx + 6 + w <= W - 2) out.push([mx + 6, clampY(my + 4), "start"]);
        if (mx - 6 - w >= 2) out.push([mx - 6, clampY(my + 4), "end"]);
      }
    }
    return out;
  }
  // the same greedy placement as the report's writer, in screen pixels of the view
  function place(wanted, W, H) {
    const grid = new Map(), placed = [];
    let dropped = 0;
    for (const it of wanted) {
      const w = CH * it.text.length;
      let done = false;
      for (const [x, y, anchor] of candidates(it.x0, it.y0, it.x1, it.y1, w, W, H)) {
        const bx = boxOf(x, y, anchor, w), cells = [];
        for (let i = Math.floor(bx[0] / CELL); i <= Math.floor(bx[2] / CELL); i++)
          for (let j = Math.floor(bx[1] / CELL); j <= Math.floor(bx[3] / CELL); j++) cells.push(i + ":" + j);
        const hit = cells.some((c) => (grid.get(c) || []).some((o) =>
          bx[0] < o[2] && o[0] < bx[2] && bx[1] < o[3] && o[1] < bx[3]));
        if (hit) continue;
        for (const c of cells) { if (!grid.has(c)) grid.set(c, []); grid.get(c).push(bx); }
        placed.push({it, x, y, anchor});
        done = true;
        break;
      }
      if (!done) dropped++;
    }
    return [placed, dropped];
  }
  for (const fig of document.querySelectorAll("figure.storey")) {
    const svg = fig.querySelector("svg.plan");
    if (!svg) continue;
    const W = svg.viewBox.baseVal.width, H = svg.viewBox.baseVal.height;
    const view = {x: 0, y: 0, k: 1};
    const labels = svg.querySelector("g.labels");
    const caption = fig.querySelector(".label-count");
    const lines = [...svg.querySelectorAll("line.beam")];
    const flagged = [];
    for (const l of lines) {
      const b = byGuid.get(l.dataset.guid);
      if (!b || b.o === 0) continue;
      flagged.push({b, x1: +l.getAttribute("x1"), y1: +l.getAttribute("y1"),
        x2: +l.getAttribute("x2"), y2: +l.getAttribute("y2"),
        text: (b.n || b.g) + (b.o === 1 ? " " + utext(b.u) : " (not checked)")});
    }
    flagged.sort((a, c) => (a.b.o - c.b.o) || ((c.b.u || 0) - (a.b.u || 0)));
    function relabel() {
      const k = view.k, wanted = [];
      for (const f of flagged) {
        const x0 = (f.x1 - view.x) * k, y0 = (f.y1 - view.y) * k;
        const x1 = (f.x2 - view.x) * k, y1 = (f.y2 - view.y) * k;
        if (Math.max(x0, x1) < 0 || Math.min(x0, x1) > W || Math.max(y0, y1) < 0 ||
            Math.min(y0, y1) > H) continue;
        wanted.push({f, text: f.text, x0, y0, x1, y1});
      }
      const [placed, dropped] = place(wanted, W, H);
      labels.innerHTML = placed.map((p) => '<text class="label' +
        (p.it.f.b.o === 2 ? " nc-label" : "") + '" data-guid-label="' + esc(p.it.f.b.g) +
        '" x="' + (view.x + p.x / k).toFixed(2) + '" y="' + (view.y + p.y / k).toFixed(2) +
        '" text-anchor="' + p.anchor + '" style="font-size:' + (11 / k).toFixed(4) +
        "px;stroke-width:" + (3 / k).toFixed(4) + 'px" fill="' +
        (p.it.f.b.o === 2 ? "#444" : "#000") + '">' + esc(p.it.text) + "</text>").join("");
      if (caption) caption.textContent = flagged.length ? placed.length + " of " +
        flagged.length + " failing or not-checked beams labelled in this view" +
        (dropped + flagged.length - wanted.length > 0 ? "; zoom in to label the others" : "") +
        "." : "";
    }
    function setView(x, y, k) {
      view.k = Math.min(Math.max(k, 1), 64);
      view.x = Math.min(Math.max(x, 0), W - W / view.k);
      view.y = Math.min(Math.max(y, 0), H - H / view.k);
      svg.setAttribute("viewBox", view.x.toFixed(3) + " " + view.y.toFixed(3) + " " +
        (W / view.k).toFixed(3) + " " + (H / view.k).toFixed(3));
      svg.style.setProperty("--k", view.k);
      svg.classList.toggle("zoomed", view.k > 1);
    }
    let timer = null;
    function zoomAt(px, py, factor) {
      const k = Math.min(Math.max(view.k * factor, 1), 64);
      const ux = view.x + px / view.k, uy = view.y + py / view.k;
      setView(ux - px / k, uy - py / k, k);
      clearTimeout(timer);
      timer = setTimeout(relabel, 120);
    }
    const local = (e) => {
      const r = svg.getBoundingClientRect();
      return [(e.clientX - r.left) * W / r.width, (e.clientY - r.top) * H / r.height];
    };
    svg.addEventListener("wheel", (e) => {
      e.preventDefault();
      const [px, py] = local(e);
      zoomAt(px, py, e.deltaY < 0 ? 1.25 : 0.8);
    }, {passive: false});
    let drag = null;
    svg.addEventListener("pointerdown", (e) => {
      if (e.button !== 0) return;
      drag = {p: local(e), x: view.x, y: view.y, moved: false};
    });
    window.addEventListener("pointermove", (e) => {
      if (!drag) return;
      const [px, py] = local(e);
      const dx = px - drag.p[0], dy = py - drag.p[1];
      if (Math.abs(dx) + Math.abs(dy) > 3) drag.moved = true;
      if (drag.moved) setView(drag.x - dx / view.k, drag.y - dy / view.k, view.k);
    });
    window.addEventListener("pointerup", () => {
      if (drag && drag.moved) { relabel(); svg.dataset.dragged = "1"; }
      drag = null;
    });
    for (const button of fig.querySelectorAll("button[data-zoom]")) {
      button.addEventListener("click", () => {
        const z = button.dataset.zoom;
        if (z === "reset") { setView(0, 0, 1); relabel(); }
        else zoomAt(W / 2, H / 2, z === "in" ? 2 : 0.5);
      });
    }
    fig.querySelector(".plan-tools").hidden = false;
    svg.addEventListener("mouseover", (e) => {
      const g = e.target.dataset && e.target.dataset.guid;
      const b = g && byGuid.get(g);
      if (!b) return;
      tip.textContent = tooltip(b);
      tip.hidden = false;
    });
    svg.addEventListener("mousemove", (e) => {
      if (tip.hidden) return;
      tip.style.left = (e.pageX + 14) + "px";
      tip.style.top = (e.pageY + 14) + "px";
    });
    svg.addEventListener("mouseout", (e) => { if (e.target.dataset.guid) tip.hidden = true; });
    // the labels as written are those of the whole storey: placed again at each zoom
    svg.addEventListener("click", (e) => {
      if (svg.dataset.dragged) { delete svg.dataset.dragged; return; }
      const g = e.target.dataset && e.target.dataset.guid;
      if (g) location.hash = "#beam-" + g;
    });
  }
  performance.mark("ifccheck-plans");

  // --- details on demand ---------------------------------------------------------
  const detail = document.getElementById("detail-view");
  function ticks(lo, hi, n) {
    if (!(isFinite(lo) && isFinite(hi)) || hi <= lo) return [lo, lo + 1];
    const rawStep = (hi - lo) / (n || 5), mag = Math.pow(10, Math.floor(Math.log10(rawStep)));
    const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= rawStep);
    const out = [];
    for (let t = Math.floor(lo / step) * step; t <= hi + step * 1e-9; t += step)
      out.push(Math.round(t * 1e10) / 1e10);
    if (out[out.length - 1] < hi) out.push(out[out.length - 1] + step);
    return out;
  }
  function axes(xt, yt, xlabel, ylabel) {
    const A = {x0: xt[0], x1: xt[xt.length - 1], y0: yt[0], y1: yt[yt.length - 1], left: 64,
      right: 16, top: 14, bottom: 40, width: 640, height: 240};
    A.px = (x, y) => [A.left + (x - A.x0) / ((A.x1 - A.x0) || 1) * (A.width - A.left - A.right),
      A.top + (1 - (y - A.y0) / ((A.y1 - A.y0) || 1)) * (A.height - A.top - A.bottom)];
    const [bx0, by0] = A.px(A.x0, A.y0), [bx1, by1] = A.px(A.x1, A.y1), f = (v) => v.toFixed(1);
    const tk = (t) => Math.abs(t) >= 1e-9 ? String(+t.toPrecision(6)) : "0";
    let s = "";
    for (const t of yt) {
      const y = A.px(A.x0, t)[1];
      s += '<line x1="' + f(bx0) + '" y1="' + f(y) + '" x2="' + f(bx1) + '" y2="' + f(y) +
        '" stroke="#e3e3e3"/><text x="' + f(bx0 - 6) + '" y="' + f(y + 4) +
        '" font-size="11" text-anchor="end">' + tk(t) + "</text>";
    }
    for (const t of xt) {
      const x = A.px(t, A.y0)[0];
      s += '<line x1="' + f(x) + '" y1="' + f(by0) + '" x2="' + f(x) + '" y2="' + f(by0 + 4) +
        '" stroke="#333"/><text x="' + f(x) + '" y="' + f(by0 + 16) +
        '" font-size="11" text-anchor="middle">' + tk(t) + "</text>";
    }
    s += '<rect x="' + f(bx0) + '" y="' + f(by1) + '" width="' + f(bx1 - bx0) + '" height="' +
      f(by0 - by1) + '" fill="none" stroke="#666"/><text x="' + f((bx0 + bx1) / 2) + '" y="' +
      f(A.height - 6) + '" font-size="11" text-anchor="middle">' + esc(xlabel) +
      '</text><text transform="translate(14 ' + f((by0 + by1) / 2) +
      ') rotate(-90)" font-size="11" text-anchor="middle">' + esc(ylabel) + "</text>";
    A.frame = s;
    return A;
  }
  const chart = (A, title, body) => '<svg class="chart" role="img" viewBox="0 0 ' + A.width +
    " " + A.height + '" width="' + A.width + '" height="' + A.height + '" aria-label="' +
    esc(title) + '"><title>' + esc(title) + "</title>" + body + "</svg>";
  function momentSvg(b) {
    const d = b.d.diagram, f = (v) => v.toFixed(1);
    const ms = d.m.filter((m) => m !== null);
    if (!ms.length) return "";
    let lo = Math.min(0, ...ms), hi = Math.max(0, ...ms);
    if (hi - lo <= 0) hi = lo + 1;
    const yt = ticks(lo, hi), xt = ticks(0, Math.max(d.x[d.x.length - 1], b.d.len));
    const A = axes(xt, yt, "station (" + U.length + ")", "moment (" + U.moment + "), sagging +");
    let s = "";
    const gi = b.d.gov;
    if (gi !== null && gi !== undefined && d.seg[gi]) {
      const [x0, yTop] = A.px(d.seg[gi][0], A.y1), [x1, yBot] = A.px(d.seg[gi][1], A.y0);
      s += '<rect class="governing" x="' + f(x0) + '" y="' + f(yTop) + '" width="' +
        f(x1 - x0) + '" height="' + f(yBot - yTop) + '" fill="#fff3c4"/>';
    }
    for (const [s0, s1] of d.cont) {
      const [x0, y] = A.px(s0, 0), [x1] = A.px(s1, 0);
      s += '<line class="slab-braced" x1="' + f(x0) + '" y1="' + f(y) + '" x2="' + f(x1) +
        '" y2="' + f(y) + '" stroke="#6a9fc0" stroke-opacity="0.45" stroke-width="10"/>';
    }
    s += A.frame;
    const pts = d.x.map((x, i) => [x, d.m[i]]).filter((p) => p[1] !== null).map((p) => A.px(p[0], p[1]));
    const yz = A.px(0, 0)[1];
    s += '<path d="M' + f(pts[0][0]) + " " + f(yz) + " " + pts.map((p) => "L" + f(p[0]) + " " +
      f(p[1])).join(" ") + " L" + f(pts[pts.length - 1][0]) + " " + f(yz) +
      ' Z" fill="#0088b7" fill-opacity="0.18" stroke="none"/>';
    s += '<polyline class="moment" fill="none" stroke="#2b2b2b" stroke-width="1.8" points="' +
      pts.map((p) => f(p[0]) + "," + f(p[1])).join(" ") + '"/>';
    s += '<line x1="' + f(A.px(A.x0, 0)[0]) + '" y1="' + f(yz) + '" x2="' + f(A.px(A.x1, 0)[0]) +
      '" y2="' + f(yz) + '" stroke="#666"/>';
    for (const [x, counts] of b.d.braces || []) {
      s += '<circle class="brace' + (counts ? "" : " brace-void") + '" cx="' + f(A.px(x, 0)[0]) +
        '" cy="' + f(yz) + '" r="4" fill="' + (counts ? "#222" : "#fff") +
        '" stroke="#222" stroke-width="1.2"/>';
    }
    if (gi !== null && gi !== undefined && d.seg[gi] && b.d.lbg) {
      const [x, y] = A.px((d.seg[gi][0] + d.seg[gi][1]) / 2, A.y1);
      s += '<text x="' + f(x) + '" y="' + f(y + 14) + '" font-size="11" text-anchor="middle">' +
        "governing: Lb " + esc(b.d.lbg) + "</text>";
    }
    return chart(A, "Moment diagram of " + (b.n || b.g), s);
  }
  function curveSvg(b) {
    const pts = D.curves[b.d.curve], mark = b.d.mark, f = (v) => v.toFixed(1);
    let xmax = Math.max(...pts.map((p) => p[0])), ymax = Math.max(...pts.map((p) => p[1]));
    if (mark) { xmax = Math.max(xmax, mark[0]); ymax = Math.max(ymax, mark[1]); }
    const xt = ticks(0, xmax), yt = ticks(0, ymax * 1.05);
    const A = axes(xt, yt, "unbraced length Lb (" + U.length + ")", D.strength + " (" + U.moment + ")");
    let s = A.frame + '<polyline class="curve" fill="none" stroke="#2a788e" stroke-width="2" points="' +
      pts.map((p) => A.px(p[0], p[1])).map((p) => f(p[0]) + "," + f(p[1])).join(" ") + '"/>';
    const t = b.d.trail;
    if (t) {
      const yTop = A.px(0, A.y1)[1], yBot = A.px(0, 0)[1];
      for (const [name, lx] of [["lp", t.lp], ["lr", t.lr]]) {
        if (!(lx > 0 && lx <= A.x1)) continue;
        const x = A.px(lx, 0)[0];
        s += '<line class="' + name + '-mark" x1="' + f(x) + '" y1="' + f(yBot) + '" x2="' + f(x) +
          '" y2="' + f(yTop) + '" stroke="#777" stroke-dasharray="2 3"/><text x="' + f(x + 3) +
          '" y="' + f(yTop + 12) + '" font-size="11" fill="#444">' + (name === "lp" ? "Lp" : "Lr") +
          " = " + lx.toFixed(2) + " " + esc(U.length) + "</text>";
      }
    }
    if (mark) {
      const [x, y] = A.px(mark[0], mark[1]), yb = A.px(mark[0], 0)[1];
      s += '<line x1="' + f(x) + '" y1="' + f(yb) + '" x2="' + f(x) + '" y2="' + f(y) +
        '" stroke="#555" stroke-dasharray="4 3"/>';
      if (mark[2] > 1) {
        const d = "M" + f(x - 6) + " " + f(y - 6) + " L" + f(x + 6) + " " + f(y + 6) + " M" +
          f(x - 6) + " " + f(y + 6) + " L" + f(x + 6) + " " + f(y - 6);
        s += '<path d="' + d + '" stroke="#fff" stroke-width="5" stroke-linecap="round"/>' +
          '<path class="segment-mark" d="' + d + '" stroke="#000" stroke-width="2.2" stroke-linecap="round"/>';
      } else {
        s += '<circle class="segment-mark" cx="' + f(x) + '" cy="' + f(y) + '" r="5" fill="#222"/>';
      }
      const text = "governing segment: utilisation " + utext(mark[2]);
      const right = x + 8 + CH * text.length <= A.width - 4;
      s += '<text class="segment-label" x="' + f(right ? x + 8 : x - 8) + '" y="' +
        f(y - 8 >= 14 ? y - 8 : y + 18) + '" font-size="11" text-anchor="' +
        (right ? "start" : "end") + '" stroke="#fff" stroke-width="3" paint-order="stroke">' +
        esc(text) + "</text>";
    }
    return chart(A, "Strength against Lb for " + (b.n || b.g), s);
  }
  function article(b) {
    const d = b.d, L = U.length, o = OUTCOMES[b.o];
    let h = '<article class="beam" id="beam-' + esc(b.g) + '"><h3>' + esc(b.n || b.g) + " " +
      outcome(o) + '</h3><p class="note">' + esc(b.p) + " · " + esc(d.grade) + " · " +
      esc(D.storeys[b.s]) + " · <code>" + esc(b.g) + "</code></p>";
    const f = d.facts;
    h += table(["Span (" + L + ")", "Fy (" + U.stress + ")", "Utilisation", "Strength", "Flexure",
      "Shear", "Deflection", "Controlling limit"], [[num(f[0]), num(f[1]), raw(ucell(f[2])),
      raw(ucell(f[3])), raw(ucell(f[4])), raw(ucell(f[5])), raw(ucell(f[6])), b.cl]], "facts");
    if (d.stages) {
      h += "<h4>Stages</h4>" + table(["Stage", "Outcome", "Utilisation", "Controlling limit",
        "Governing segment", "Lb (" + L + ")", "Cb", "Load combination"], d.stages.map((r) =>
        [r[0] + (r[8] ? " (governs)" : ""), raw("<td>" + outcome(r[1]) + "</td>"),
          raw(ucell(r[2])), r[3], num(r[4]), num(r[5]), num(r[6]), r[7]]),
      "stages", d.stages.findIndex((r) => r[8]));
    }
    if (d.why) {
      h += '<div class="why"><h4>Why it fails and what would make it pass' +
        (d.why_stage ? " (" + esc(d.why_stage) + ")" : "") + "</h4><ul>" +
        d.why.map((x) => "<li>" + esc(x) + "</li>").join("") + "</ul></div>";
    } else if (d.fix) {
      h += '<p class="fix">' + esc(d.fix) + "</p>";
    }
    if (d.reason !== undefined) {
      h += '<div class="why"><h4>Not checked</h4><p>' + esc(d.reason) + "</p><p>" +
        esc(d.advice) + "</p></div>";
    }
    if (d.segs.length) {
      const head = ["#", "From (" + L + ")", "To (" + L + ")", "Lb (" + L + ")", "Cb",
        "Compression flange", "Moment (" + U.moment + ")", D.strength + " (" + U.moment + ")",
        "Utilisation", "Limit state", "Load combination"];
      if (D.staged) head.push("Stage");
      h += "<h4>Unbraced segments</h4><p class=\"note\">Stations are measured from " +
        esc(endWords(b, 0)) + " (the beam's start) towards " + esc(endWords(b, 1)) + ".</p>" +
        table(head, d.segs.map((r) => {
          const cells = [num(r[0]), num(r[1]), num(r[2]), num(r[3]), num(r[4]), r[5], num(r[6]),
            num(r[7]), num(r[8]), r[9], r[10]];
          if (D.staged) cells.push(r[11]);
          return cells;
        }), "segments", d.gov);
    }
    if (d.diagram) {
      h += "<figure>" + momentSvg(b) + "<figcaption>Moment under the governing combination; " +
        "dots are brace points (hollow: does not count), the shaded band the governing " +
        "segment, the blue band slab-braced length.</figcaption></figure>";
    }
    if (d.curve !== undefined) {
      h += "<figure>" + curveSvg(b) + "<figcaption>Design strength " + esc(D.strength) +
        " against unbraced length for this section and the governing segment's Cb, with Lp " +
        "and Lr marked; the marker is the governing segment at its Lb and moment (a cross " +
        "where it fails).</figcaption></figure>";
    }
    if (d.trail) {
      h += '<details class="trail"><summary>Hand-check trail</summary>' +
        table(["Quantity", "Value", "Note"], D.trail.map((r, i) => {
          const q = i === 17 ? d.trail.sym : r[0];
          const note = i === 14 ? d.trail.cbn : i === 16 ? d.trail.ls : r[1];
          const v = d.trail.v[i] !== null ? d.trail.v[i] : D.sections[d.trail.sec][i];
          return [q, v, note];
        }).filter((r) => r[1] !== null), "trail") +
        "<p class='note'>Equations used:</p><ul class='equations'>" +
        d.trail.eq.map((e) => "<li>" + esc(D.equations[e]) + "</li>").join("") + "</ul></details>";
    }
    if (d.braces) {
      h += "<h4>Brace points</h4>" + table(["Station (" + L + ")", "From the nearer end", "Kind",
        "Flange", "Counts", "By", "Appendix 6 (needed / provided)", "Why not"],
        d.braces.map((r) => [num(r[0].toFixed(2)), stationText(b, r[0]), r[2], r[3],
          r[1] ? "yes" : "no", ref(r[4]), r[5], r[6]]), "braces");
    }
    if (d.demand) {
      h += "<h4>Demand</h4><p>" + esc(d.demand.text) + "</p>";
      if (d.demand.lines.length) h += table(["Case", "Line load (" + U["line load"] + ")", "From",
        "To", "Source"], d.demand.lines.map((r) => [r[0], num(r[1]), num(r[2]), num(r[3]), r[4]]));
      if (d.demand.points.length) h += table(["Case", "Point load (" + U.force + ")", "Station",
        "Delivered by"], d.demand.points.map((r) => [r[0], num(r[1]), num(r[2]), ref(r[3])]));
      if (d.demand.more) h += '<p class="note">and ' + d.demand.more + " more loads (the JSON " +
        "results list them all).</p>";
    }
    if (d.notes) h += "<h4>Notes</h4><ul>" + d.notes.map((n) => "<li>" + esc(n) + "</li>").join("") + "</ul>";
    return h + "</article>";
  }
  function openFromHash() {
    const m = /^#beam-(.+)$/.exec(decodeURIComponent(location.hash));
    if (!m || !detail) return;
    const b = byGuid.get(m[1]);
    if (!b) return;
    detail.innerHTML = article(b);
    document.getElementById("beam-" + b.g).scrollIntoView();
  }
  window.addEventListener("hashchange", openFromHash);
  openFromHash();
  root.dataset.ready = "1";
}

if (typeof DecompressionStream === "undefined") {
  const v = document.getElementById("detail-view");
  if (v) v.textContent = "This browser cannot unpack the report's data (no DecompressionStream).";
  root.dataset.ready = "unsupported";
  return;
}
unpack().then(start).catch((e) => {
  root.dataset.ready = "error";
  const v = document.getElementById("detail-view");
  if (v) v.textContent = "The report's data could not be read: " + e;
});
})();
"""

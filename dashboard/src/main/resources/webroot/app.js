'use strict';
// The steamtally page. Every value from the server reaches the document through textContent or an
// SVG text node's textContent, never through innerHTML, so a tag or name that is markup shows as text.
(() => {
  const SVG = 'http://www.w3.org/2000/svg';
  const state = {
    plant: null, unitId: null, unitDesc: null, result: null, receivedAt: 0, staleAfterS: 10,
    diagram: null, diagramKey: '', system: 'SI', session: null, alarms: [], stream: null, view: 'cycle',
    serverStale: false, loadError: null,
  };

  // ------------------------------------------------------------------ DOM helpers
  function $(id) { return document.getElementById(id); }
  function el(tag, attrs, ...children) {
    const e = document.createElement(tag);
    for (const [k, v] of Object.entries(attrs || {})) {
      if (k === 'class') e.className = v; else e.setAttribute(k, v);
    }
    for (const c of children) e.append(c instanceof Node ? c : document.createTextNode(String(c)));
    return e;
  }
  function svg(tag, attrs, text) {
    const e = document.createElementNS(SVG, tag);
    for (const [k, v] of Object.entries(attrs || {})) e.setAttribute(k, String(v));
    if (text !== undefined) e.textContent = text;
    return e;
  }
  function clear(node) { while (node.firstChild) node.removeChild(node.firstChild); }
  function tag(text, kind) { return el('span', { class: 'tag tag-' + kind }, text); }

  // ------------------------------------------------------------------ API
  async function api(path, options) {
    const res = await fetch(path, Object.assign({ credentials: 'same-origin' }, options || {}));
    let body = null;
    const type = res.headers.get('Content-Type') || '';
    if (type.startsWith('application/json')) body = await res.json();
    if (!res.ok) {
      const message = body && body.message ? body.message : res.status + ' ' + res.statusText;
      const err = new Error(message);
      err.status = res.status;
      throw err;
    }
    return body;
  }
  function change(path, body) {
    const headers = { 'Content-Type': 'application/json' };
    if (state.session) headers['X-CSRF-Token'] = state.session.csrf_token;
    return api(path, { method: 'POST', headers, body: JSON.stringify(body || {}) });
  }

  // ------------------------------------------------------------------ formatting
  function sys() { return Units.systems[state.system]; }
  function num(opt, fmt) {
    if (opt === null || opt === undefined) return null;
    return fmt(opt);
  }
  // Stale when the server says so (it judges the result's time against its own clock) or when this
  // page has heard nothing for longer than the unit's stale-after age (the stream itself may be cut).
  function stale() {
    return !state.result || state.serverStale || (Date.now() - state.receivedAt) > state.staleAfterS * 1000;
  }

  // ------------------------------------------------------------------ views
  function showView(name) {
    state.view = ['cycle', 'alarms', 'trends', 'shifts', 'plant'].includes(name) ? name : 'cycle';
    for (const s of document.querySelectorAll('section.view')) s.hidden = s.id !== 'view-' + state.view;
    for (const a of document.querySelectorAll('#views a')) {
      if (a.dataset.view === state.view) a.setAttribute('aria-current', 'page'); else a.removeAttribute('aria-current');
    }
    if (state.view === 'alarms') loadAlarms();
    HistoryViews.show(state.view, state.unitId);
  }

  // ------------------------------------------------------------------ metrics
  function setMetric(id, value, invalidReason) {
    const box = $(id);
    const v = box.querySelector('.value');
    const mark = box.querySelector('.mark');
    clear(v); clear(mark);
    const isStale = stale();
    if (value === null) {
      v.append('—');
      mark.append(state.result ? 'INVALID — ' + (invalidReason || 'its inputs are invalid') : 'NO DATA');
    } else {
      v.append(value.text);
      if (value.unit) v.append(el('span', { class: 'unit' }, value.unit));
      if (isStale) mark.append('STALE');
    }
    box.classList.toggle('untrusted', value !== null && isStale);
  }

  function renderMetrics() {
    const c = state.result ? state.result.cycle : {};
    const bad = state.result ? state.result.states.filter(x => !x.valid).map(x => x.id) : [];
    const why = bad.length ? 'needs ' + bad.join(', ') : null;
    setMetric('metric-eta', num(c.thermal_efficiency, Units.percent), why);
    setMetric('metric-net', num(c.net_work_W, Units.power), why);
    setMetric('metric-hr', num(c.heat_rate_kJ_per_kWh, v => sys().heatRate(v)), why);
    setMetric('metric-bwr', num(c.back_work_ratio, Units.ratio), why);
  }

  function renderStatus() {
    const s = $('unit-status');
    const banner = $('stale-banner');
    clear(s); clear(banner);
    if (!state.result) {
      s.className = 'status status-none'; s.append('NO DATA');
      banner.hidden = false;
      banner.append(state.loadError ? 'NO DATA — ' + state.loadError
        : 'NO DATA — no result has arrived for this unit. Nothing shown here is current.');
    } else if (stale()) {
      const age = Math.round((Date.now() - state.receivedAt) / 1000);
      s.className = 'status status-stale'; s.append('STALE');
      banner.hidden = false;
      banner.append('STALE — last result ' + state.result.ts + ', received ' + age
        + ' s ago. Values below are not current.');
    } else {
      s.className = 'status status-live'; s.append('LIVE');
      banner.hidden = true;
    }
    $('result-time').textContent = state.result ? 'Result time ' + state.result.ts + ' (UTC)' : '';
  }

  // ------------------------------------------------------------------ balance checks
  // One row per channel: the single snapshot's reconciliation and, when the daemon runs it, the
  // window mean's. The verdict is a word, never a colour alone.
  function verdict(r, filling) {
    if (!r) return { word: 'NOT RUN', kind: 'low', detail: '' };
    const ratio = (r.chi2_limit ? 'χ² ' + Units.fixed(r.chi2, 2) + ' of limit ' + Units.fixed(r.chi2_limit, 2) : '');
    const names = (r.suspects || []).map(x => x.equivalence_set && x.equivalence_set.length > 1
      ? x.id + ' (or ' + x.equivalence_set.filter(i => i !== x.id).join(', ') + ')' : x.id);
    let word; let kind;
    if (r.status === 'passed') { word = 'PASSED'; kind = 'ok'; }
    else if (r.status === 'failed') { word = 'FAILED'; kind = 'high'; }
    else { word = String(r.status || 'not run').replace(/_/g, ' ').toUpperCase(); kind = 'low'; }
    const parts = [];
    if (ratio) parts.push(ratio);
    if (names.length) parts.push('suspect: ' + names.join(', '));
    if (filling) parts.push(filling);
    return { word, kind, detail: parts.join('; ') };
  }
  function renderChecks() {
    const t = $('checks-table');
    clear(t);
    t.append(el('tr', {}, el('th', { class: 'text' }, 'Check'), el('th', { class: 'text' }, 'Verdict'),
      el('th', { class: 'text' }, 'Detail')));
    if (!state.result) return;
    const rec = state.result.reconciliation;
    const one = verdict(rec ? Object.assign({ suspects: state.result.suspects }, rec) : null, null);
    t.append(el('tr', {}, el('td', { class: 'text' }, 'Each snapshot'),
      el('td', { class: 'text' }, tag(one.word, one.kind)), el('td', { class: 'text' }, one.detail)));
    const w = state.result.window_reconciliation;
    if (w) {
      const filling = w.samples < w.length ? 'window filling: ' + w.samples + ' of ' + w.length + ' snapshots' : null;
      const v = verdict(w, [filling, w.reason].filter(Boolean).join('; ') || null);
      t.append(el('tr', {}, el('td', { class: 'text' }, 'Mean of the last ' + Units.fixed(w.length_s, 0) + ' s'),
        el('td', { class: 'text' }, tag(v.word, v.kind)), el('td', { class: 'text' }, v.detail)));
    }
  }

  // ------------------------------------------------------------------ state table
  function stateById() {
    const m = new Map();
    if (state.result) for (const s of state.result.states) m.set(s.id, s);
    return m;
  }
  function renderStateTable() {
    const t = $('state-table');
    clear(t);
    const u = sys();
    const head = el('tr', {}, el('th', {}, 'State'), el('th', {}, 'p [' + (state.system === 'SI' ? 'kPa/MPa' : 'psia') + ']'),
      el('th', {}, 'T [' + u.tAxisUnit + ']'), el('th', {}, 'h [' + u.enthalpy(0).unit + ']'),
      el('th', {}, 's [' + u.entropy(0).unit + ']'), el('th', {}, 'x'), el('th', {}, 'ṁ [' + u.flow(0).unit + ']'),
      el('th', { class: 'text' }, 'Phase / status'));
    t.append(el('thead', {}, head));
    const body = el('tbody');
    const isStale = stale();
    for (const s of (state.result ? state.result.states : [])) {
      const fmt = (v, f) => (v === null || v === undefined) ? '—' : (() => { const r = f(v); return r.text + (r.unit && f === u.pressure ? ' ' + r.unit : ''); })();
      const status = el('td', { class: 'text' }, s.phase ? s.phase.replace('_', '-') : '');
      if (!s.valid) status.append(tag('INVALID', 'invalid'), ' ', s.reason || '');
      else if (isStale) status.append(tag('STALE', 'stale'));
      const tr = el('tr', { class: s.valid && !isStale ? '' : 'invalid' },
        el('td', {}, s.id), el('td', {}, fmt(s.p_Pa, u.pressure)), el('td', {}, fmt(s.T_K, u.temperature)),
        el('td', {}, fmt(s.h_J_per_kg, u.enthalpy)), el('td', {}, fmt(s.s_J_per_kgK, u.entropy)),
        el('td', {}, fmt(s.x, Units.quality)), el('td', {}, fmt(s.m_kg_per_s, u.flow)), status);
      body.append(tr);
    }
    t.append(body);
  }

  // ------------------------------------------------------------------ schematic
  // Components (without the generator, which has no ports) are placed clockwise around a rectangle in
  // the plant description's order, which follows the flow; each flowing state is a line from the
  // component it leaves to the one it enters, with its values in a box on the line.
  const W = 1200, H = 860;
  function layoutComponents(comps) {
    const placed = new Map();
    const x0 = 130, y0 = 90, x1 = W - 130, y1 = H - 90;
    const per = 2 * (x1 - x0) + 2 * (y1 - y0);
    comps.forEach((c, i) => {
      let d = per * (i / comps.length);
      let x, y;
      if (d < x1 - x0) { x = x0 + d; y = y0; }
      else if ((d -= x1 - x0) < y1 - y0) { x = x1; y = y0 + d; }
      else if ((d -= y1 - y0) < x1 - x0) { x = x1 - d; y = y1; }
      else { d -= x1 - x0; x = x0; y = y1 - d; }
      placed.set(c.id, { x, y, c });
    });
    return placed;
  }
  function componentShape(g, p) {
    const type = p.c.type;
    if (type === 'pump') {
      g.append(svg('circle', { cx: p.x, cy: p.y, r: 34, class: 'sch-box' }));
      g.append(svg('path', { d: `M${p.x - 16},${p.y + 14} L${p.x},${p.y - 18} L${p.x + 16},${p.y + 14} Z`, class: 'sch-box' }));
      return { w: 70, h: 70 };
    }
    if (type === 'turbine') {
      g.append(svg('path', { d: `M${p.x - 90},${p.y - 34} L${p.x + 90},${p.y - 58} L${p.x + 90},${p.y + 58} L${p.x - 90},${p.y + 34} Z`, class: 'sch-box' }));
      return { w: 180, h: 116 };
    }
    const w = 190, h = 84;
    g.append(svg('rect', { x: p.x - w / 2, y: p.y - h / 2, width: w, height: h, rx: type === 'steam_generator' ? 2 : 10, class: 'sch-box' }));
    return { w, h };
  }
  const TYPE_NAMES = {
    steam_generator: 'steam generator', turbine: 'turbine', condenser: 'condenser', pump: 'pump',
    open_feedwater_heater: 'open heater', closed_feedwater_heater: 'closed heater', reheater: 'reheater',
    mixer: 'mixer', generator: 'generator',
  };
  function edgePoint(p, size, toward) {
    const dx = toward.x - p.x, dy = toward.y - p.y;
    const sx = size.w / 2 / Math.max(Math.abs(dx), 1e-9), sy = size.h / 2 / Math.max(Math.abs(dy), 1e-9);
    const s = Math.min(sx, sy, 1);
    return { x: p.x + dx * s, y: p.y + dy * s };
  }
  function overlaps(a, b, pad) {
    return a.x < b.x + b.w + pad && b.x < a.x + a.w + pad && a.y < b.y + b.h + pad && b.y < a.y + a.h + pad;
  }
  // Where a state's label goes: on its line or just beside it (either side) near the middle, else the
  // free place nearest the line's middle found on a coarse grid; the frame may grow downwards for it,
  // at a penalty, so that a label never covers a component or another label. Returns the box with the
  // point on the line it belongs to (ax, ay), for a leader line when the two are apart.
  function placeLabel(pa, pb, w, h, taken) {
    const free = c => !taken.some(o => overlaps(c, o, 6));
    const at = (cx, cy, ax, ay) => ({ x: Math.min(Math.max(cx - w / 2, 2), W - w - 2), y: Math.max(cy - h / 2, 2), w, h, ax, ay });
    const dx = pb.x - pa.x, dy = pb.y - pa.y, len = Math.hypot(dx, dy) || 1;
    const nx = -dy / len, ny = dx / len;
    // Centre distance at which the box's edge clears the line by a few pixels.
    const off = Math.abs(nx) * w / 2 + Math.abs(ny) * h / 2 + 8;
    for (const t of [0.5, 0.4, 0.6, 0.3, 0.7, 0.22, 0.78]) {
      const lx = pa.x + dx * t, ly = pa.y + dy * t;
      for (const c of [at(lx, ly, lx, ly), at(lx + nx * off, ly + ny * off, lx, ly), at(lx - nx * off, ly - ny * off, lx, ly)]) {
        if (free(c)) return c;
      }
    }
    const mx = pa.x + dx / 2, my = pa.y + dy / 2;
    let best = null, bestCost = Infinity;
    for (let y = 2; y < H + 900; y += 12) {
      for (let x = 2; x <= W - w - 2; x += 12) {
        const cost = Math.hypot(x + w / 2 - mx, y + h / 2 - my) + (y + h > H ? 400 : 0);
        if (cost >= bestCost) continue;
        const c = { x, y, w, h, ax: mx, ay: my };
        if (free(c)) { best = c; bestCost = cost; }
      }
    }
    return best || at(mx, my, mx, my);
  }
  function dutyText(rc) {
    if (!state.result) return { text: '', bad: false };
    if (!rc || !rc.valid) return { text: 'INVALID', bad: true };
    if (rc.work_out_W !== null && Math.abs(rc.work_out_W) > 0) return { text: 'W ' + Units.power(rc.work_out_W).text + ' MW', bad: false };
    if (rc.heat_in_W !== null && Math.abs(rc.heat_in_W) > 0) return { text: 'Q ' + Units.power(rc.heat_in_W).text + ' MW', bad: false };
    return { text: '', bad: false };
  }
  function renderSchematic() {
    const root = $('schematic');
    clear(root);
    root.setAttribute('viewBox', `0 0 ${W} ${H}`);
    const defs = svg('defs');
    const marker = svg('marker', { id: 'arrow', viewBox: '0 0 10 10', refX: 9, refY: 5, markerWidth: 6, markerHeight: 6, orient: 'auto-start-reverse' });
    marker.append(svg('path', { d: 'M0,0 L10,5 L0,10 z', fill: '#cfd8de' }));
    defs.append(marker);
    root.append(defs);
    if (!state.unitDesc) return;
    const comps = state.unitDesc.components.filter(c => c.type !== 'generator');
    const placed = layoutComponents(comps);
    const sizes = new Map();
    const gComp = svg('g', { class: 'sch-components' });
    for (const p of placed.values()) sizes.set(p.c.id, componentShape(gComp, p));
    // Rectangles that state labels must keep clear of: the components and their text.
    const taken = [...placed.values()].map(p => {
      const z = sizes.get(p.c.id);
      return p.c.type === 'pump' ? { x: p.x - 95, y: p.y - z.h / 2 - 30, w: 190, h: z.h + 66 } : { x: p.x - z.w / 2, y: p.y - z.h / 2, w: z.w, h: z.h };
    });
    const byId = stateById();
    const resultComps = new Map((state.result ? state.result.components : []).map(c => [c.id, c]));
    const isStale = stale();
    const u = sys();
    const gFlow = svg('g'), gLabels = svg('g', { class: 'sch-labels' }), gLeaders = svg('g');
    let bottom = H;
    const states = state.unitDesc.states.filter(s => !s.reference);
    for (const sd of states) {
      const from = comps.find(c => c.outlets.includes(sd.id));
      const to = comps.find(c => c.inlets.includes(sd.id));
      if (!from || !to) continue;
      const a = placed.get(from.id), b = placed.get(to.id);
      const pa = edgePoint(a, sizes.get(from.id), b), pb = edgePoint(b, sizes.get(to.id), a);
      const r = byId.get(sd.id);
      const ok = r && r.valid;
      const cls = 'sch-flow' + (!ok ? ' invalid' : (r.phase === 'vapour' || r.phase === 'supercritical' ? ' vapour' : ''));
      gFlow.append(svg('line', { x1: pa.x, y1: pa.y, x2: pb.x, y2: pb.y, class: cls, 'marker-end': 'url(#arrow)' }));
      const lines = [];
      if (!r) {
        lines.push(['NO DATA', 'invalid']);
      } else if (!r.valid) {
        lines.push(['INVALID', 'invalid']);
        if (r.p_Pa !== null) { const p = u.pressure(r.p_Pa); lines.push([`p ${p.text} ${p.unit}`, '']); }
      } else {
        const p = u.pressure(r.p_Pa), T = u.temperature(r.T_K), h = u.enthalpy(r.h_J_per_kg);
        lines.push([`p ${p.text} ${p.unit}   T ${T.text} ${T.unit}`, '']);
        lines.push([`h ${h.text} ${h.unit}` + (r.x !== null ? `   x ${Units.quality(r.x).text}` : ''), '']);
        if (isStale) lines.push(['STALE', 'invalid']);
      }
      const boxW = 250, boxH = 24 + 19 * lines.length;
      const box = placeLabel(pa, pb, boxW, boxH, taken);
      taken.push(box);
      const gl = svg('g', { class: 'sch-state-label' });
      // A label that had to move off its line points back to it.
      const ex = Math.min(Math.max(box.ax, box.x), box.x + boxW), ey = Math.min(Math.max(box.ay, box.y), box.y + boxH);
      if (Math.hypot(ex - box.ax, ey - box.ay) > 4) gLeaders.append(svg('line', { x1: box.ax, y1: box.ay, x2: ex, y2: ey, class: 'sch-leader' }));
      gl.append(svg('rect', { x: box.x, y: box.y, width: boxW, height: boxH, rx: 3, class: 'sch-label-box' + (ok && !isStale ? '' : ' invalid') }));
      gl.append(svg('text', { x: box.x + 7, y: box.y + 17, class: 'sch-label-id' }, sd.id));
      lines.forEach((ln, j) => gl.append(svg('text', { x: box.x + 7, y: box.y + 37 + 19 * j, class: 'sch-label' + (ln[1] ? ' ' + ln[1] : '') }, ln[0])));
      gLabels.append(gl);
      bottom = Math.max(bottom, box.y + boxH);
    }
    root.append(gFlow, gComp);
    for (const p of placed.values()) {
      const z = sizes.get(p.c.id);
      const duty = dutyText(resultComps.get(p.c.id));
      const dutyClass = 'sch-duty' + (duty.bad || (isStale && duty.text) ? ' invalid' : '');
      if (p.c.type === 'pump') {
        root.append(svg('text', { x: p.x, y: p.y - z.h / 2 - 10, 'text-anchor': 'middle', class: 'sch-title' }, p.c.id));
        if (duty.text) root.append(svg('text', { x: p.x, y: p.y + z.h / 2 + 22, 'text-anchor': 'middle', class: dutyClass }, duty.text));
      } else {
        root.append(svg('text', { x: p.x, y: p.y - 12, 'text-anchor': 'middle', class: 'sch-title' }, p.c.id));
        root.append(svg('text', { x: p.x, y: p.y + 7, 'text-anchor': 'middle', class: 'sch-sub' }, TYPE_NAMES[p.c.type] || p.c.type));
        if (duty.text) root.append(svg('text', { x: p.x, y: p.y + 29, 'text-anchor': 'middle', class: dutyClass }, duty.text));
      }
    }
    root.append(gLeaders, gLabels);
    // Labels that found no room inside the usual frame went below it; the drawing grows to hold them,
    // and the stale band gets a strip of its own so that it covers nothing.
    let height = Math.max(H, Math.ceil(bottom) + 6);
    if (isStale && state.result) {
      height = Math.max(height, bottom + 52);
      root.append(svg('rect', { x: W / 2 - 230, y: height - 44, width: 460, height: 40, class: 'sch-stale-band' }));
      root.append(svg('text', { x: W / 2, y: height - 13, 'text-anchor': 'middle', class: 'sch-stale' }, 'STALE — NOT CURRENT'));
    }
    root.setAttribute('viewBox', `0 0 ${W} ${height}`);
  }

  // ------------------------------------------------------------------ T–s diagram
  const TW = 900, TH = 640, M = { l: 70, r: 20, t: 20, b: 56 };
  function cycleOrder() {
    // Follows the flow from the steam generator's outlet back to its inlet; turbine extractions are
    // points on the expansion, in falling pressure.
    const comps = state.unitDesc.components;
    const consumer = id => comps.find(c => c.inlets.includes(id));
    const byId = stateById();
    const gen = comps.find(c => c.type === 'steam_generator');
    if (!gen) return [];
    const path = [];
    let s = gen.outlets[0];
    for (let guard = 0; guard < 60 && s; guard++) {
      const c = consumer(s);
      path.push({ id: s, via: null });
      if (!c) break;
      if (c.type === 'turbine') {
        const ext = c.outlets.slice(0, -1).filter(id => byId.get(id)).sort((a, b) => byId.get(b).p_Pa - byId.get(a).p_Pa);
        for (const e of ext) path.push({ id: e, via: c });
      }
      const next = c.type === 'turbine' ? c.outlets[c.outlets.length - 1] : c.outlets[0];
      if (path.length && path[path.length - 1]) path[path.length - 1].nextVia = c;
      s = next;
      if (s === gen.outlets[0]) { path.push({ id: s, via: c }); break; }
    }
    return path;
  }
  const HEAT_EXCHANGE = new Set(['steam_generator', 'reheater', 'condenser', 'open_feedwater_heater', 'closed_feedwater_heater']);

  function renderTs() {
    const root = $('ts');
    clear(root);
    root.setAttribute('viewBox', `0 0 ${TW} ${TH}`);
    if (!state.diagram) {
      root.append(svg('text', { x: TW / 2, y: TH / 2, 'text-anchor': 'middle', class: 'ts-axis-label' }, 'Waiting for the first result'));
      return;
    }
    const u = sys();
    const byId = stateById();
    const valid = [...byId.values()].filter(s => s.valid && s.T_K !== null && s.s_J_per_kgK !== null);
    // At least 850 K, so that the axis does not jump when the hottest state turns invalid and the
    // inset (top left) stays clear of the dome.
    const tMaxK = Math.max(850, ...valid.map(s => s.T_K + 30));
    const sMin = 0, sMax = 9500, tMinK = 273.15;
    const X = s => M.l + (s - sMin) / (sMax - sMin) * (TW - M.l - M.r);
    const Y = t => TH - M.b - (t - tMinK) / (tMaxK - tMinK) * (TH - M.t - M.b);
    const clip = svg('clipPath', { id: 'ts-clip' });
    clip.append(svg('rect', { x: M.l, y: M.t, width: TW - M.l - M.r, height: TH - M.t - M.b }));
    const defs = svg('defs'); defs.append(clip); root.append(defs);

    // Axes and grid in the chosen unit system.
    const ticks = (lo, hi, n) => { const step = niceStep((hi - lo) / n); const out = []; for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-9; v += step) out.push(v); return out; };
    const tLo = u.tAxis(tMinK), tHi = u.tAxis(tMaxK);
    for (const v of ticks(tLo, tHi, 8)) {
      const k = tMinK + (v - tLo) / (tHi - tLo) * (tMaxK - tMinK);
      root.append(svg('line', { x1: M.l, x2: TW - M.r, y1: Y(k), y2: Y(k), class: 'ts-gridline' }));
      root.append(svg('text', { x: M.l - 6, y: Y(k) + 4, 'text-anchor': 'end', class: 'ts-tick' }, Units.fixed(v, 0)));
    }
    const sLo = u.sAxis(sMin), sHi = u.sAxis(sMax);
    for (const v of ticks(sLo, sHi, 9)) {
      const j = sMin + (v - sLo) / (sHi - sLo) * (sMax - sMin);
      root.append(svg('line', { x1: X(j), x2: X(j), y1: M.t, y2: TH - M.b, class: 'ts-gridline' }));
      root.append(svg('text', { x: X(j), y: TH - M.b + 18, 'text-anchor': 'middle', class: 'ts-tick' }, Units.fixed(v, 1)));
    }
    root.append(svg('line', { x1: M.l, x2: M.l, y1: M.t, y2: TH - M.b, class: 'ts-axis' }));
    root.append(svg('line', { x1: M.l, x2: TW - M.r, y1: TH - M.b, y2: TH - M.b, class: 'ts-axis' }));
    root.append(svg('text', { x: (TW + M.l) / 2, y: TH - 10, 'text-anchor': 'middle', class: 'ts-axis-label' }, 'specific entropy s [' + u.sAxisUnit + ']'));
    root.append(svg('text', { x: 16, y: (TH - M.b) / 2, transform: `rotate(-90 16 ${(TH - M.b) / 2})`, 'text-anchor': 'middle', class: 'ts-axis-label' }, 'temperature T [' + u.tAxisUnit + ']'));

    const g = svg('g', { 'clip-path': 'url(#ts-clip)' });
    const line = (pts, cls) => svg('polyline', { points: pts.map(p => X(p[0]).toFixed(1) + ',' + Y(p[1]).toFixed(1)).join(' '), class: cls });
    const isoLabels = [];
    for (const iso of state.diagram.isobars) {
      g.append(line(iso.points, 'ts-isobar'));
      const last = iso.points.filter(p => p[1] <= tMaxK && p[0] <= sMax).pop();
      if (!last) continue;
      const lx = Math.min(X(last[0]) + 4, TW - M.r - 70);
      let ly = Math.max(Y(last[1]) - 4, M.t + 12);
      while (isoLabels.some(l => Math.abs(l.x - lx) < 75 && Math.abs(l.y - ly) < 14)) ly += 14;
      isoLabels.push({ x: lx, y: ly });
      root.append(svg('text', { x: lx, y: ly, class: 'ts-isobar-label' }, u.pressureLabel(iso.p_Pa)));
    }
    g.append(line(state.diagram.dome, 'ts-dome'));

    // The cycle, joined in flow order; heat exchange follows the nearest isobar between its ends.
    const path = cycleOrder();
    // A state that is invalid breaks the line: no segment is drawn through a point that is not known.
    let pts = [];
    const flush = () => { if (pts.length > 1) g.append(line(pts, 'ts-cycle')); pts = []; };
    for (let i = 0; i < path.length; i++) {
      const r = byId.get(path[i].id);
      if (!r || !r.valid || r.s_J_per_kgK === null) { flush(); continue; }
      const prev = i > 0 ? byId.get(path[i - 1].id) : null;
      const via = i > 0 ? path[i - 1].nextVia : null;
      if (pts.length && prev && prev.valid && via && HEAT_EXCHANGE.has(via.type)) pts.push(...alongIsobar(prev, r));
      pts.push([r.s_J_per_kgK, r.T_K]);
    }
    flush();
    // Ideal (isentropic) references: dashed from the state they start at.
    for (const sd of state.unitDesc.states.filter(s => s.reference)) {
      const r = byId.get(sd.id), from = byId.get(sd.from_state);
      if (r && r.valid && from && from.valid) g.append(line([[from.s_J_per_kgK, from.T_K], [r.s_J_per_kgK, r.T_K]], 'ts-ideal'));
    }
    root.append(g);
    const labelled = [];
    for (const r of byId.values()) {
      if (!r.valid || r.s_J_per_kgK === null) continue;
      const sd = state.unitDesc.states.find(s => s.id === r.id);
      const ideal = sd && sd.reference;
      const x = X(r.s_J_per_kgK), y = Y(r.T_K);
      root.append(svg('circle', { cx: x, cy: y, r: ideal ? 5 : 6, class: 'ts-point' + (ideal ? ' ideal' : '') }));
      // Labels that would overlap an earlier one move down a line.
      let ly = y - 8;
      while (labelled.some(l => Math.abs(l.x - x) < 110 && Math.abs(l.y - ly) < 13)) ly += 13;
      labelled.push({ x, y: ly });
      root.append(svg('text', { x: x + 8, y: ly, class: 'ts-label' }, r.id));
    }
    const invalid = [...byId.values()].filter(r => !r.valid).map(r => r.id);
    if (invalid.length) {
      root.append(svg('text', { x: M.l + 10, y: TH - M.b - 10, class: 'ts-label invalid' }, 'INVALID, not drawn: ' + invalid.join(', ')));
    }
    if (stale()) root.append(svg('text', { x: TW / 2, y: TH / 2 + 60, 'text-anchor': 'middle', class: 'sch-stale' }, 'STALE'));
    renderPumpInset(root, X, Y);
  }

  function alongIsobar(a, b) {
    const p = b.p_Pa;
    let best = null;
    for (const iso of state.diagram.isobars) if (!best || Math.abs(Math.log(iso.p_Pa / p)) < Math.abs(Math.log(best.p_Pa / p))) best = iso;
    if (!best || Math.abs(Math.log(best.p_Pa / p)) > 0.1) return [];
    const lo = Math.min(a.s_J_per_kgK, b.s_J_per_kgK), hi = Math.max(a.s_J_per_kgK, b.s_J_per_kgK);
    const inner = best.points.filter(q => q[0] > lo && q[0] < hi);
    return a.s_J_per_kgK <= b.s_J_per_kgK ? inner : inner.reverse();
  }

  // The pumps' inlet and outlet nearly coincide at this scale; the inset magnifies the pump with the
  // largest pressure rise so that the compression can be seen.
  function renderPumpInset(root, X, Y) {
    const byId = stateById();
    let best = null;
    for (const c of state.unitDesc.components.filter(c => c.type === 'pump')) {
      const a = byId.get(c.inlets[0]), b = byId.get(c.outlets[0]);
      if (a && b && a.valid && b.valid && (!best || b.p_Pa - a.p_Pa > best.b.p_Pa - best.a.p_Pa)) best = { c, a, b };
    }
    if (!best) return;
    const { a, b } = best;
    const ds = Math.max(Math.abs(b.s_J_per_kgK - a.s_J_per_kgK), 2), dt = Math.max(Math.abs(b.T_K - a.T_K), 0.5);
    const s0 = Math.min(a.s_J_per_kgK, b.s_J_per_kgK) - ds, s1 = Math.max(a.s_J_per_kgK, b.s_J_per_kgK) + ds;
    const t0 = Math.min(a.T_K, b.T_K) - dt, t1 = Math.max(a.T_K, b.T_K) + dt;
    // Mark the zoomed area on the main diagram (at least a few pixels so that it shows).
    const zx = X(s0), zy = Y(t1), zw = Math.max(X(s1) - X(s0), 8), zh = Math.max(Y(t0) - Y(t1), 8);
    root.append(svg('rect', { x: zx - 4, y: zy - 4, width: zw + 8, height: zh + 8, class: 'ts-zoom-box' }));
    const ix = M.l + 16, iy = M.t + 12, iw = 300, ih = 200;
    root.append(svg('line', { x1: ix + iw, y1: iy + ih, x2: zx, y2: zy, class: 'ts-zoom-box' }));
    root.append(svg('rect', { x: ix, y: iy, width: iw, height: ih, class: 'ts-inset-frame' }));
    root.append(svg('text', { x: ix + 8, y: iy + 17, class: 'ts-inset-title' }, 'zoom: ' + best.c.id));
    const x = s => ix + 20 + (s - s0) / (s1 - s0) * (iw - 70);
    const y = t => iy + ih - 26 - (t - t0) / (t1 - t0) * (ih - 92);
    root.append(svg('line', { x1: x(a.s_J_per_kgK), y1: y(a.T_K), x2: x(b.s_J_per_kgK), y2: y(b.T_K), class: 'ts-cycle' }));
    const u = sys();
    for (const [r, name] of [[a, 'in'], [b, 'out']]) {
      root.append(svg('circle', { cx: x(r.s_J_per_kgK), cy: y(r.T_K), r: 5, class: 'ts-point' }));
      root.append(svg('text', { x: x(r.s_J_per_kgK) + 9, y: y(r.T_K) + 5, class: 'ts-label' }, name));
    }
    const pa = u.pressure(a.p_Pa), pb = u.pressure(b.p_Pa);
    root.append(svg('text', { x: ix + 8, y: iy + 36, class: 'ts-tick' }, 'in  ' + a.id + ' ' + pa.text + ' ' + pa.unit));
    root.append(svg('text', { x: ix + 8, y: iy + 54, class: 'ts-tick' }, 'out ' + b.id + ' ' + pb.text + ' ' + pb.unit));
    const dT = u.tAxis(b.T_K) - u.tAxis(a.T_K);
    root.append(svg('text', { x: ix + 8, y: iy + ih - 6, class: 'ts-tick' },
      'ΔT ' + Units.fixed(dT, 2) + ' ' + u.tAxisUnit + '   Δs ' + Units.fixed(u.sAxis(b.s_J_per_kgK - a.s_J_per_kgK), 4) + ' ' + u.sAxisUnit));
  }

  function niceStep(raw) {
    const mag = Math.pow(10, Math.floor(Math.log10(raw)));
    const n = raw / mag;
    return (n < 1.5 ? 1 : n < 3.5 ? 2 : n < 7.5 ? 5 : 10) * mag;
  }

  async function refreshDiagram() {
    if (!state.result) return;
    const key = state.result.states.filter(s => s.p_Pa !== null).map(s => s.p_Pa.toPrecision(2)).sort().join('|');
    if (key === state.diagramKey && state.diagram) return;
    state.diagramKey = key;
    try {
      state.diagram = await api('/api/v1/units/' + encodeURIComponent(state.unitId) + '/ts-diagram');
    } catch (e) {
      state.diagram = null;
    }
    renderTs();
  }

  // ------------------------------------------------------------------ alarms
  async function loadAlarms() {
    if (!state.unitId) return;
    try {
      const body = await api('/api/v1/units/' + encodeURIComponent(state.unitId) + '/alarms');
      state.alarms = body.alarms;
    } catch (e) {
      $('alarm-message').textContent = e.message;
    }
    renderAlarms();
  }
  function renderAlarms() {
    const count = state.alarms.filter(a => a.state === 'unacknowledged' || a.state === 'returned_unacknowledged').length;
    $('alarm-count').textContent = count ? String(count) : '';
    const t = $('alarm-table');
    clear(t);
    const operator = state.session && state.session.role === 'operator';
    $('alarm-login-hint').hidden = operator;
    t.append(el('thead', {}, el('tr', {}, el('th', { class: 'text' }, 'Priority'), el('th', { class: 'text' }, 'State'),
      el('th', { class: 'text' }, 'Since (UTC)'), el('th', { class: 'text' }, 'Alarm'), el('th', { class: 'text' }, 'Sensor, bias, balances'),
      el('th', {}, 'Action'))));
    const body = el('tbody');
    for (const a of state.alarms) {
      const detail = el('td', { class: 'text' });
      if (a.sensor) detail.append(el('div', {}, 'sensor ', el('strong', {}, a.sensor)));
      if (a.bias_si !== null) detail.append(el('div', {}, 'estimated bias ' + Units.fixed(a.bias_si, 2) + ' ' + (a.bias_unit || '')));
      if (a.balances.length) detail.append(el('div', {}, 'balances: ' + a.balances.join(', ')));
      const stateCell = el('td', { class: 'text' }, tag(a.state.replace(/_/g, ' ').toUpperCase(), a.state === 'unacknowledged' ? 'high' : 'low'));
      if (a.shelved_until) stateCell.append(el('div', {}, 'until ' + a.shelved_until), el('div', {}, 'reason: ' + (a.shelve_reason || '')));
      const actions = el('div', { class: 'alarm-actions' });
      if (operator) {
        if (a.state === 'unacknowledged' || a.state === 'returned_unacknowledged') {
          const b = el('button', { type: 'button', 'data-action': 'ack', 'data-alarm': a.id }, 'Acknowledge');
          b.addEventListener('click', () => act(a.id, 'acknowledge', {}));
          actions.append(b);
        }
        if (a.state === 'shelved') {
          const b = el('button', { type: 'button', 'data-action': 'unshelve', 'data-alarm': a.id }, 'Unshelve');
          b.addEventListener('click', () => act(a.id, 'unshelve', {}));
          actions.append(b);
        } else {
          const reason = el('input', { placeholder: 'reason for shelving', maxlength: '500', 'aria-label': 'shelve reason' });
          const minutes = el('select', { 'aria-label': 'shelve duration' });
          for (const m of [15, 60, 240, 480]) minutes.append(el('option', { value: String(m) }, m < 60 ? m + ' min' : (m / 60) + ' h'));
          const b = el('button', { type: 'button', 'data-action': 'shelve', 'data-alarm': a.id }, 'Shelve');
          b.addEventListener('click', () => {
            if (!reason.value.trim()) { $('alarm-message').textContent = 'Give a reason before shelving.'; return; }
            act(a.id, 'shelve', { duration_min: Number(minutes.value), reason: reason.value.trim() });
          });
          actions.append(reason, minutes, b);
        }
      } else {
        actions.append(el('span', { class: 'hint-line' }, 'log in to act'));
      }
      body.append(el('tr', { 'data-alarm-row': a.id },
        el('td', { class: 'text' }, tag(a.priority.toUpperCase(), a.priority)),
        stateCell, el('td', { class: 'text' }, a.since), el('td', { class: 'text' }, a.message), detail, el('td', {}, actions)));
    }
    if (!state.alarms.length) body.append(el('tr', {}, el('td', { colspan: '6', class: 'text' }, 'No alarms.')));
    t.append(body);
  }
  async function act(id, action, body) {
    $('alarm-message').textContent = '';
    try {
      await change('/api/v1/alarms/' + encodeURIComponent(id) + '/' + action, body);
      $('alarm-message').textContent = action + ': done (' + id + ')';
    } catch (e) {
      $('alarm-message').textContent = e.message;
    }
    loadAlarms();
  }

  // ------------------------------------------------------------------ plant
  function renderPlant() {
    if (!state.plant || !state.unitDesc) return;
    $('plant-title').textContent = state.plant.site.name + ' — ' + state.unitDesc.name;
    const ct = $('component-table');
    clear(ct);
    ct.append(el('thead', {}, el('tr', {}, el('th', { class: 'text' }, 'Component'), el('th', { class: 'text' }, 'Type'),
      el('th', { class: 'text' }, 'In'), el('th', { class: 'text' }, 'Out'))));
    const cb = el('tbody');
    for (const c of state.unitDesc.components) {
      cb.append(el('tr', {}, el('td', {}, c.id), el('td', { class: 'text' }, TYPE_NAMES[c.type] || c.type),
        el('td', { class: 'text' }, c.inlets.join(', ')), el('td', { class: 'text' }, c.outlets.join(', '))));
    }
    ct.append(cb);
    const st = $('sensor-table');
    clear(st);
    st.append(el('thead', {}, el('tr', {}, el('th', { class: 'text' }, 'Tag'), el('th', { class: 'text' }, 'Quantity'),
      el('th', { class: 'text' }, 'Unit'), el('th', {}, 'u (SI)'), el('th', {}, 'Range (SI)'), el('th', {}, 'Max age [s]'))));
    const sb = el('tbody');
    for (const s of state.unitDesc.sensors) {
      sb.append(el('tr', {}, el('td', {}, s.id), el('td', { class: 'text' }, s.quantity.replace('_', ' ')),
        el('td', { class: 'text' }, s.engineering_unit), el('td', {}, s.standard_uncertainty_si.toPrecision(3) + ' ' + s.si_unit),
        el('td', {}, s.range_min_si.toPrecision(4) + ' … ' + s.range_max_si.toPrecision(4)), el('td', {}, String(s.max_age_s))));
    }
    st.append(sb);
  }

  // ------------------------------------------------------------------ session
  function renderSession() {
    const logged = !!state.session;
    $('login-form').hidden = logged;
    $('who').hidden = !logged;
    $('logout-button').hidden = !logged;
    $('who').textContent = logged ? state.session.user + ' (' + state.session.role + ')' : '';
    renderAlarms();
  }
  async function login(ev) {
    ev.preventDefault();
    $('login-message').textContent = '';
    try {
      state.session = await api('/api/v1/session', {
        method: 'POST', headers: { 'Content-Type': 'application/json' },
        body: JSON.stringify({ user: $('login-user').value, password: $('login-password').value }),
      });
      $('login-password').value = '';
      if (!state.plant) await loadPlant();
    } catch (e) {
      $('login-message').textContent = e.message;
    }
    renderSession();
  }
  async function logout() {
    try {
      await api('/api/v1/session', { method: 'DELETE', headers: { 'X-CSRF-Token': state.session.csrf_token } });
    } catch (e) { /* the session is gone either way */ }
    state.session = null;
    renderSession();
  }

  // ------------------------------------------------------------------ live
  function renderAll() {
    renderStatus();
    renderMetrics();
    renderChecks();
    renderSchematic();
    renderTs();
    renderStateTable();
  }
  function openStream() {
    if (state.stream) state.stream.close();
    state.result = null;
    state.diagram = null;
    state.diagramKey = '';
    const es = new EventSource('/api/v1/units/' + encodeURIComponent(state.unitId) + '/stream');
    es.addEventListener('result', ev => {
      state.result = JSON.parse(ev.data);
      state.receivedAt = Date.now();
      state.serverStale = false;
      renderAll();
      refreshDiagram();
    });
    es.addEventListener('alarm', () => loadAlarms());
    state.stream = es;
  }
  async function pollStatus() {
    try {
      const units = await api('/api/v1/units');
      const me = units.units.find(u => u.unit === state.unitId);
      const was = stale();
      // A result newer than the one the server judged keeps the page live.
      state.serverStale = !!me && me.status === 'stale' && !!state.result && me.last_result_ts === state.result.ts;
      if (stale() !== was) renderAll();
    } catch (e) { /* the next poll tries again */ }
  }
  function selectUnit(id) {
    state.unitId = id;
    state.unitDesc = state.plant.units.find(u => u.id === id) || null;
    renderPlant();
    renderAll();
    openStream();
    loadAlarms();
    HistoryViews.show(state.view, id);
  }
  function setSystem(name) {
    state.system = name;
    $('system-si').setAttribute('aria-pressed', String(name === 'SI'));
    $('system-us').setAttribute('aria-pressed', String(name === 'US'));
    try { localStorage.setItem('steamtally.system', name); } catch (e) { /* private mode */ }
    renderAll();
    if (state.view === 'trends' || state.view === 'shifts') HistoryViews.show(state.view, state.unitId);
  }

  // Loads the plant and the units; when anonymous viewing is off this fails until a login succeeds.
  async function loadPlant() {
    try {
      state.plant = await api('/api/v1/plant');
      state.loadError = null;
      const units = await api('/api/v1/units');
      const sel = $('unit-select');
      clear(sel);
      for (const u of units.units) sel.append(el('option', { value: u.unit }, u.name + ' (' + u.unit + ')'));
      sel.onchange = () => selectUnit(sel.value);
      if (units.units.length) {
        state.staleAfterS = units.units[0].stale_after_s;
        setSystem(state.system);
        selectUnit(units.units[0].unit);
      }
    } catch (e) {
      state.plant = null;
      state.loadError = e.message;
      renderStatus();
    }
  }

  async function start() {
    $('login-form').addEventListener('submit', login);
    $('logout-button').addEventListener('click', logout);
    $('system-si').addEventListener('click', () => setSystem('SI'));
    $('system-us').addEventListener('click', () => setSystem('US'));
    HistoryViews.init();
    window.addEventListener('hashchange', () => showView(location.hash.slice(1)));
    try { state.system = localStorage.getItem('steamtally.system') === 'US' ? 'US' : 'SI'; } catch (e) { /* default */ }
    try { state.session = await api('/api/v1/session'); } catch (e) { state.session = null; }
    renderSession();
    await loadPlant();
    showView(location.hash.slice(1));
    // Freshness is re-judged every second, so that a silent stream turns the view stale on its own,
    // and the server's judgement is fetched every few seconds.
    setInterval(() => { const was = $('unit-status').textContent; renderStatus(); if ($('unit-status').textContent !== was) renderAll(); }, 1000);
    setInterval(pollStatus, 3000);
  }
  document.addEventListener('DOMContentLoaded', start);
})();

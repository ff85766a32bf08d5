'use strict';
// Trends and shift review: the views that read the result store. Charts are drawn by uPlot, served
// from its webjar by the dashboard itself; every value from the server reaches the document through
// textContent, so a sensor tag that is markup shows as text.
const HistoryViews = (() => {
  const WORSE = 'worse';
  const BETTER = 'better';
  let unitId = null;
  let trendRange = 'shift';
  let xRange = null;  // [from, to] of the trend, in seconds, shared by every chart
  const charts = {};

  function $(id) { return document.getElementById(id); }
  function el(tag, attrs, ...children) {
    const e = document.createElement(tag);
    for (const [k, v] of Object.entries(attrs || {})) {
      if (k === 'class') e.className = v; else e.setAttribute(k, v);
    }
    for (const c of children) e.append(c instanceof Node ? c : document.createTextNode(String(c)));
    return e;
  }
  function clear(node) { while (node.firstChild) node.removeChild(node.firstChild); }
  // Heat rate follows the page's unit system: kJ/kWh, or kBtu/kWh with 1 Btu_IT = 1.055 056 kJ
  // (NIST SP 811, as in units.js). Efficiency, power and MWh are the same in both.
  const KJ_PER_KBTU = 1055.056;
  function us() { const b = document.getElementById('system-us'); return !!b && b.getAttribute('aria-pressed') === 'true'; }
  function css(name) { return getComputedStyle(document.documentElement).getPropertyValue(name).trim(); }

  async function getJson(path) {
    const res = await fetch(path, { credentials: 'same-origin' });
    const type = res.headers.get('Content-Type') || '';
    const body = type.startsWith('application/json') ? await res.json() : null;
    if (!res.ok) {
      const err = new Error(body && body.message ? body.message : res.status + ' ' + res.statusText);
      err.status = res.status;
      throw err;
    }
    return body;
  }
  function unitPath(rest) { return '/api/v1/units/' + encodeURIComponent(unitId) + rest; }

  // ------------------------------------------------------------------ ranges
  function localInput(d) {
    const p = n => String(n).padStart(2, '0');
    return d.getFullYear() + '-' + p(d.getMonth() + 1) + '-' + p(d.getDate()) + 'T' + p(d.getHours()) + ':' + p(d.getMinutes());
  }
  function dateInput(d) { return localInput(d).slice(0, 10); }
  function fromDateInput(v) { const [y, m, d] = v.split('-').map(Number); return new Date(y, m - 1, d); }
  function fmtTime(d) {
    return d.toLocaleString('en-GB', { year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' });
  }

  /** [from, to] of the named range; "shift" asks the server for the running shift of the site's calendar. */
  async function resolveRange(name) {
    const now = new Date();
    if (name === 'hour') return [new Date(now.getTime() - 3600e3), now];
    if (name === 'day') return [new Date(now.getTime() - 24 * 3600e3), now];
    if (name === 'custom') {
      const from = new Date($('trend-from').value);
      const to = new Date($('trend-to').value);
      if (isNaN(from) || isNaN(to)) throw new Error('enter both the start and the end of the custom range');
      if (from >= to) throw new Error('the custom range must start before it ends');
      return [from, to];
    }
    const body = await getJson(unitPath('/shifts?from=' + new Date(now.getTime() - 24 * 3600e3).toISOString()
      + '&to=' + now.toISOString()));
    const last = body.shifts[body.shifts.length - 1];
    if (!last) return [new Date(now.getTime() - 8 * 3600e3), now];
    return [new Date(last.start), now];
  }

  // ------------------------------------------------------------------ trends
  async function loadTrends(name) {
    if (name) trendRange = name;
    for (const b of document.querySelectorAll('#trend-range [data-range]')) {
      b.setAttribute('aria-pressed', String(b.dataset.range === trendRange));
    }
    const msg = $('trends-message');
    msg.textContent = 'Loading…';
    try {
      const [from, to] = await resolveRange(trendRange);
      if (trendRange !== 'custom') { $('trend-from').value = localInput(from); $('trend-to').value = localInput(to); }
      const body = await getJson(unitPath('/trends?series=thermal_efficiency,heat_rate_kJ_per_kWh,net_work_W,'
        + 'closure_residual_W,reconciled_minus_measured&from=' + from.toISOString() + '&to=' + to.toISOString()));
      xRange = [from.getTime() / 1000, to.getTime() / 1000];
      $('trends-range').textContent = fmtTime(from) + ' to ' + fmtTime(to) + ', buckets of '
        + body.bucket_s + ' s (line: mean; shaded: smallest to largest in the bucket)';
      msg.textContent = '';
      drawTrends(body);
    } catch (e) {
      msg.textContent = e.message;
      for (const k of Object.keys(charts)) { charts[k].destroy(); delete charts[k]; }
      for (const id of ['chart-eta', 'chart-hr', 'chart-net', 'chart-closure', 'chart-recon']) clear($(id));
    }
  }

  function secs(t) { return Date.parse(t) / 1000; }

  function bandChart(id, series, scale, label, unit, digits) {
    const b = (series && series.buckets) || [];
    const data = [b.map(x => secs(x.t)), b.map(x => x.mean * scale), b.map(x => x.min * scale), b.map(x => x.max * scale)];
    const accent = css('--accent');
    draw(id, data, [
      {},
      { label: label + ' (mean)', stroke: accent, width: 2, value: (u, v) => v == null ? '–' : v.toFixed(digits) + ' ' + unit },
      { label: 'smallest', stroke: 'rgba(111,180,232,0.35)', width: 1, points: { show: false }, value: (u, v) => v == null ? '–' : v.toFixed(digits) },
      { label: 'largest', stroke: 'rgba(111,180,232,0.35)', width: 1, points: { show: false }, value: (u, v) => v == null ? '–' : v.toFixed(digits) },
    ], [{ series: [3, 2], fill: 'rgba(111,180,232,0.18)' }], b.length === 0);
  }

  function drawTrends(body) {
    const s = body.series;
    bandChart('chart-eta', s.thermal_efficiency, 100, 'Efficiency', '%', 2);
    if (us()) bandChart('chart-hr', s.heat_rate_kJ_per_kWh, 1 / KJ_PER_KBTU, 'Heat rate', 'kBtu/kWh', 3);
    else bandChart('chart-hr', s.heat_rate_kJ_per_kWh, 1, 'Heat rate', 'kJ/kWh', 0);
    $('hr-unit').textContent = us() ? 'kBtu/kWh' : 'kJ/kWh';
    bandChart('chart-net', s.net_work_W, 1e-6, 'Net power', 'MW', 2);

    const c = s.closure_residual_W;
    const cb = (c && c.buckets) || [];
    const k = c ? c.k : 2;
    $('closure-hint').textContent = 'residual of closure "' + (c ? c.closure : 'cycle') + '" and ±' + k + 'σ band, MW';
    const sig = x => x.sigma_mean == null ? null : k * x.sigma_mean / 1e6;
    draw('chart-closure', [cb.map(x => secs(x.t)), cb.map(x => x.mean / 1e6), cb.map(sig), cb.map(x => sig(x) == null ? null : -sig(x))], [
      {},
      { label: 'Residual (mean)', stroke: css('--amber'), width: 2, value: (u, v) => v == null ? '–' : v.toFixed(3) + ' MW' },
      { label: '+' + k + 'σ', stroke: css('--muted'), width: 1, dash: [6, 4], points: { show: false }, value: (u, v) => v == null ? '–' : v.toFixed(3) },
      { label: '−' + k + 'σ', stroke: css('--muted'), width: 1, dash: [6, 4], points: { show: false }, value: (u, v) => v == null ? '–' : v.toFixed(3) },
    ], [{ series: [2, 3], fill: 'rgba(169,182,191,0.15)' }], cb.length === 0);

    const sensors = (s.reconciled_minus_measured && s.reconciled_minus_measured.sensors) || [];
    const times = [...new Set(sensors.flatMap(x => x.buckets.map(b => secs(b.t))))].sort((a, b) => a - b);
    const palette = [css('--amber'), css('--accent'), css('--ok'), css('--bad'), css('--text')];
    const dashes = [[], [8, 4], [2, 3], [10, 3, 2, 3], [4, 4]];
    const data = [times];
    const opts = [{}];
    sensors.forEach((x, i) => {
      const m = new Map(x.buckets.map(b => [secs(b.t), b.mean]));
      data.push(times.map(t => m.has(t) ? m.get(t) : null));
      const unit = x.unit || '';
      // Each sensor has its own dash pattern as well as its own colour, so the lines part without colour.
      opts.push({ label: x.sensor + ' (flagged ' + x.suspect_count + '×)', stroke: palette[i % palette.length],
        width: 2, dash: dashes[i % dashes.length], value: (u, v) => v == null ? '–' : v.toPrecision(3) + ' ' + unit });
    });
    $('recon-message').textContent = sensors.length ? '' : 'No sensor was flagged suspect in this range.';
    draw('chart-recon', data, opts, [], sensors.length === 0);
  }

  function draw(id, data, series, bands, empty) {
    if (charts[id]) { charts[id].destroy(); delete charts[id]; }
    const host = $(id);
    clear(host);
    host.classList.toggle('empty', !!empty);
    if (empty) { host.append(el('p', { class: 'chart-empty' }, 'No data in this range.')); return; }
    const axis = { stroke: css('--muted'), grid: { stroke: css('--grid'), width: 1 }, ticks: { stroke: css('--grid') },
      font: '13px "DejaVu Sans", sans-serif' };
    // The host's content width (its padding is .3rem on each side).
    const width = Math.max(320, (host.clientWidth || host.parentElement.clientWidth - 30) - 12);
    const span = xRange ? xRange[1] - xRange[0] : 86400;
    const p = n => String(n).padStart(2, '0');
    // 24-hour clock; the date too when the range is longer than a day.
    const tick = t => { const d = new Date(t * 1000); const hm = p(d.getHours()) + ':' + p(d.getMinutes());
      return span > 26 * 3600 ? p(d.getDate()) + '/' + p(d.getMonth() + 1) + ' ' + hm : hm; };
    series[0] = { label: 'Time', value: (u, v) => v == null ? '–' : fmtTime(new Date(v * 1000)) };
    charts[id] = new uPlot({
      width, height: 220, series, bands,
      scales: { x: { time: true, range: (u, min, max) => xRange || [min, max] } },
      axes: [Object.assign({ space: 70, values: (u, splits) => splits.map(tick) }, axis), Object.assign({ size: 64 }, axis)],
      legend: { live: true }, cursor: { drag: { x: false, y: false } },
    }, data, host);
  }

  // ------------------------------------------------------------------ shift review
  // Metrics compared with the baseline: key, label, format, direction (+1: more is better).
  const METRICS = [
    { key: 'energy_out_MWh', label: 'Net energy, MWh', fmt: v => v.toFixed(1), dir: 0 },
    { key: 'energy_in_MWh', label: 'Heat added, MWh', fmt: v => v.toFixed(1), dir: 0 },
    { key: 'efficiency_from_energy', label: 'Efficiency from energy, %', fmt: v => (100 * v).toFixed(2), dir: 1 },
    { key: 'mean_thermal_efficiency', label: 'Mean thermal efficiency, %', fmt: v => (100 * v).toFixed(2), dir: 1 },
    { key: 'worst_thermal_efficiency', label: 'Lowest thermal efficiency, %', fmt: v => (100 * v).toFixed(2), dir: 1 },
    { key: 'mean_heat_rate_kJ_per_kWh', label: 'Mean heat rate', heatRate: true, dir: -1 },
    { key: 'worst_heat_rate_kJ_per_kWh', label: 'Highest heat rate', heatRate: true, dir: -1 },
    { key: 'coverage', label: 'Time with data, %', fmt: v => (100 * v).toFixed(0), dir: 0 },
    { key: 'alarms_active_h', label: 'Alarms active, h', fmt: v => v.toFixed(2), dir: -1 },
    { key: 'closure_max_abs_z', label: 'Closure, largest |z|', fmt: v => v.toFixed(2), dir: -1 },
  ];
  function label(m) { return m.heatRate ? m.label + (us() ? ', kBtu/kWh' : ', kJ/kWh') : m.label; }
  function format(m, v) {
    if (!m.heatRate) return m.fmt(v);
    return us() ? (v / KJ_PER_KBTU).toFixed(3) : v.toFixed(0);
  }
  function metric(shift, key) {
    if (key === 'alarms_active_h') return shift.alarms_active_s / 3600;
    if (key === 'closure_max_abs_z') return shift.closures.length ? Math.max(...shift.closures.map(c => c.max_abs_z)) : null;
    if (shift.covered_s === 0) return null;
    const v = shift[key];
    return v === undefined ? null : v;
  }
  function stats(values) {
    const v = values.filter(x => x !== null && x !== undefined);
    if (!v.length) return null;
    const mean = v.reduce((a, b) => a + b, 0) / v.length;
    const sd = v.length > 1 ? Math.sqrt(v.reduce((a, b) => a + (b - mean) ** 2, 0) / (v.length - 1)) : 0;
    return { mean, sd, n: v.length };
  }
  /** 'worse', 'better' or null: beyond twice the baseline's spread, and at least 0.5 % of its mean. */
  function deviation(m, value, base) {
    if (value === null || !base || m.dir === 0) return null;
    const limit = Math.max(2 * base.sd, 0.005 * Math.abs(base.mean));
    const d = value - base.mean;
    if (Math.abs(d) <= limit) return null;
    return Math.sign(d) === m.dir ? BETTER : WORSE;
  }

  function initShiftForm() {
    if ($('review-from').value) return;
    const today = new Date();
    const yesterday = new Date(today.getFullYear(), today.getMonth(), today.getDate() - 1);
    $('review-from').value = dateInput(yesterday);
    $('review-to').value = dateInput(today);
    $('base-from').value = dateInput(new Date(yesterday.getFullYear(), yesterday.getMonth(), yesterday.getDate() - 7));
    $('base-to').value = dateInput(new Date(yesterday.getFullYear(), yesterday.getMonth(), yesterday.getDate() - 1));
  }
  function period(fromId, toId) {
    const from = fromDateInput($(fromId).value);
    const last = fromDateInput($(toId).value);
    const to = new Date(last.getFullYear(), last.getMonth(), last.getDate() + 1);
    if (isNaN(from) || isNaN(to)) throw new Error('enter the first and the last day of both periods');
    if (from >= to) throw new Error('a period must start on or before its last day');
    return [from, to];
  }

  async function loadShifts() {
    initShiftForm();
    const msg = $('shift-message');
    msg.textContent = 'Loading…';
    try {
      const [rf, rt] = period('review-from', 'review-to');
      const [bf, bt] = period('base-from', 'base-to');
      const q = (f, t) => '/shifts?from=' + f.toISOString() + '&to=' + t.toISOString();
      $('shift-csv').href = unitPath(q(rf, rt) + '&format=csv');
      const [review, base] = await Promise.all([getJson(unitPath(q(rf, rt))), getJson(unitPath(q(bf, bt)))]);
      renderShifts(review, base, [bf, bt]);
      msg.textContent = review.shifts.length ? '' : 'No shift has started in the review period yet.';
    } catch (e) {
      msg.textContent = e.message;
      clear($('shift-table'));
    }
  }

  function renderShifts(review, base, basePeriod) {
    const table = $('shift-table');
    clear(table);
    const zone = review.zone;
    const localTime = t => new Date(t).toLocaleString('en-GB', { timeZone: zone, weekday: 'short', day: '2-digit', month: 'short', hour: '2-digit', minute: '2-digit' });
    const head = el('tr', {}, el('th', { class: 'text', scope: 'col' }, 'Shift (' + zone + ')'));
    for (const s of review.shifts) {
      head.append(el('th', { scope: 'col' }, el('span', { class: 'shift-name' }, s.shift + (s.running ? ' (running)' : '')),
        el('br'), localTime(s.start), el('br'), el('span', { class: 'shift-len' }, (s.length_s / 3600).toFixed(0) + ' h')));
    }
    const baseShifts = base.shifts.filter(s => s.covered_s > 0);
    head.append(el('th', { scope: 'col', class: 'baseline-col' }, el('span', { class: 'shift-name' }, 'Baseline'), el('br'),
      basePeriod[0].toLocaleDateString('en-GB') + ' – ' + new Date(basePeriod[1].getTime() - 1).toLocaleDateString('en-GB'),
      el('br'), el('span', { class: 'shift-len' }, baseShifts.length + ' shifts with data, mean ± sd')));
    table.append(el('thead', {}, head));
    const tbody = el('tbody');
    for (const m of METRICS) {
      const b = stats(baseShifts.map(s => metric(s, m.key)));
      const row = el('tr', {}, el('th', { class: 'text', scope: 'row' }, label(m)));
      for (const s of review.shifts) {
        const v = metric(s, m.key);
        const td = el('td');
        if (v === null) {
          td.append(el('span', { class: 'nodata' }, 'no data'));
        } else {
          td.append(format(m, v));
          const dev = deviation(m, v, b);
          if (dev) {
            td.classList.add('dev-cell', 'dev-cell-' + dev);
            td.append(el('br'), el('span', { class: 'dev dev-' + dev }, (dev === WORSE ? '▼ WORSE' : '▲ BETTER')
              + ' (' + (v - b.mean >= 0 ? '+' : '−') + format(m, Math.abs(v - b.mean)) + ')'));
          }
        }
        row.append(td);
      }
      row.append(el('td', { class: 'baseline-col' }, b ? format(m, b.mean) + ' ± ' + format(m, b.sd) : 'no data'));
      tbody.append(row);
    }
    const sus = el('tr', {}, el('th', { class: 'text', scope: 'row' }, 'Suspect sensors (records flagged)'));
    for (const s of review.shifts) {
      sus.append(el('td', { class: 'suspects' }, s.top_suspects.length
        ? s.top_suspects.map(x => x.sensor + ' (' + x.suspect_count + ')').join(', ') : '–'));
    }
    sus.append(el('td', { class: 'baseline-col' }, ''));
    tbody.append(sus);
    table.append(tbody);
  }

  // ------------------------------------------------------------------ alarm history
  async function loadAlarmHistory() {
    const table = $('alarm-history-table');
    const msg = $('alarm-history-message');
    const to = new Date();
    const from = new Date(to.getTime() - 24 * 3600e3);
    try {
      const body = await getJson(unitPath('/alarms/history?from=' + from.toISOString() + '&to=' + to.toISOString()));
      clear(table);
      table.append(el('thead', {}, el('tr', {}, ...['Time (UTC)', 'Alarm', 'Event', 'State', 'Priority', 'By', 'Note']
        .map(h => el('th', { class: 'text', scope: 'col' }, h)))));
      const tbody = el('tbody');
      for (const e of body.events.slice().reverse()) {
        const kind = e.kind === 'transition' ? (e.active ? 'became active' : 'cleared') : e.kind;
        tbody.append(el('tr', { class: 'history-' + e.kind },
          el('td', { class: 'text' }, e.ts.replace('T', ' ').replace('Z', '')),
          el('td', { class: 'text' }, e.alarm),
          el('td', { class: 'text' }, el('strong', {}, kind.toUpperCase())),
          el('td', { class: 'text' }, e.old_state.replace(/_/g, ' ') + ' → ' + e.new_state.replace(/_/g, ' ')),
          el('td', { class: 'text' }, e.priority),
          el('td', { class: 'text' }, e.user || '–'),
          el('td', { class: 'text' }, e.note || '')));
      }
      if (!body.events.length) tbody.append(el('tr', {}, el('td', { colspan: '7', class: 'text' }, 'No alarm events in the last 24 h.')));
      table.append(tbody);
      msg.textContent = body.truncated ? 'Only the first ' + body.events.length + ' events of the range are shown.' : '';
    } catch (e) {
      clear(table);
      msg.textContent = e.message;
    }
  }

  // ------------------------------------------------------------------ wiring
  function init() {
    for (const b of document.querySelectorAll('#trend-range [data-range]')) {
      if (b.type !== 'submit') b.addEventListener('click', () => loadTrends(b.dataset.range));
    }
    $('trend-range').addEventListener('submit', ev => { ev.preventDefault(); loadTrends('custom'); });
    $('shift-form').addEventListener('submit', ev => { ev.preventDefault(); loadShifts(); });
    $('shift-print').addEventListener('click', () => window.print());
  }

  /** Called by the page when a view opens or the unit changes. */
  function show(view, unit) {
    unitId = unit;
    if (!unitId) return;
    if (view === 'trends') loadTrends();
    if (view === 'shifts') loadShifts();
    if (view === 'alarms') loadAlarmHistory();
  }

  return { init, show };
})();

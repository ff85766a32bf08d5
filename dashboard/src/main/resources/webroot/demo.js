// Fault injection for the demo only. The panel appears when the server has the demo routes
// (GET /api/v1/demo answers); the daemon's `run` does not register them, so there it stays absent.
// Elements are built with createElement and textContent only, like the rest of the page.
'use strict';
(function () {
  async function session() {
    const r = await fetch('/api/v1/session', { credentials: 'same-origin' });
    return r.ok ? r.json() : null;
  }

  function field(labelText, input) {
    const label = document.createElement('label');
    label.textContent = labelText + ' ';
    label.appendChild(input);
    return label;
  }

  function build(info) {
    const panel = document.createElement('section');
    panel.id = 'demo-faults';
    panel.className = 'demo-panel';
    panel.setAttribute('aria-label', 'Demo: inject a sensor fault');
    const title = document.createElement('h2');
    title.textContent = 'Demo: inject a sensor fault';
    panel.appendChild(title);
    const hint = document.createElement('p');
    hint.className = 'hint';
    hint.textContent = 'Log in as the demo operator (the password is printed by the demo command), pick a sensor '
      + 'and a fault; a bias of 10 sigma on FT-421 or TT-101 raises the suspect-sensor alarm within about 15 s.';
    panel.appendChild(hint);

    const form = document.createElement('form');
    const sensor = document.createElement('select');
    for (const u of info.units) {
      for (const s of u.sensors) {
        const o = document.createElement('option');
        o.value = s;
        o.textContent = s;
        sensor.appendChild(o);
      }
    }
    if ([...sensor.options].some(o => o.value === 'FT-421')) sensor.value = 'FT-421';
    const kind = document.createElement('select');
    for (const k of info.kinds) {
      const o = document.createElement('option');
      o.value = k;
      o.textContent = k;
      kind.appendChild(o);
    }
    const size = document.createElement('input');
    size.type = 'number';
    size.step = 'any';
    size.value = '10';
    const duration = document.createElement('input');
    duration.type = 'number';
    duration.min = '1';
    duration.max = '3600';
    duration.value = '300';
    const go = document.createElement('button');
    go.type = 'submit';
    go.textContent = 'Inject';
    const message = document.createElement('span');
    message.className = 'message';
    message.setAttribute('role', 'status');
    form.append(field('Sensor', sensor), field('Kind', kind), field('Size (sigma, or factor for noise)', size),
      field('Duration (s)', duration), go, message);
    form.addEventListener('submit', async (ev) => {
      ev.preventDefault();
      const s = await session();
      if (!s || !s.csrf_token) {
        message.textContent = 'Log in as an operator first.';
        return;
      }
      const r = await fetch('/api/v1/demo/faults', {
        method: 'POST',
        credentials: 'same-origin',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': s.csrf_token },
        body: JSON.stringify({ sensor: sensor.value, kind: kind.value, size_sigma: Number(size.value),
          duration_s: Number(duration.value) })
      });
      const body = await r.json().catch(() => ({}));
      message.textContent = r.ok
        ? 'Injected: ' + body.kind + ' on ' + body.sensor + ' until ' + body.end
        : 'Refused: ' + (body.message || r.status);
    });
    panel.appendChild(form);
    const main = document.querySelector('main');
    if (main) main.appendChild(panel);
  }

  window.addEventListener('DOMContentLoaded', async () => {
    try {
      const r = await fetch('/api/v1/demo', { credentials: 'same-origin' });
      if (r.ok) build(await r.json());
    } catch (e) {
      // Not the demo, or the server is away: no panel.
    }
  });
})();

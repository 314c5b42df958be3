// Site health: overview tiles against the previous period, a time series of any metric with annotations.

import { h, uid, select } from '../dom.js';
import { heading, showScope, metrics, emptyMessage } from '../screen.js';
import { METRICS, metric, overviewValue, formatMetric, formatChange } from '../metrics.js';
import { COLORS, alpha, sparkline } from '../charts.js';
import { daysIn, previousRange } from '../range.js';

export const id = 'health';
export const title = 'Health';

const LABEL_MAX = 28;

export async function render(ctx) {
  const { state, fmt } = ctx;
  const chosen = metric(state.extras.metric);
  const scope = heading(ctx, `${ctx.site.name}: health`, 'Each tile compares this period with the one just before '
    + 'it; a badge marks only changes that are statistically meaningful at 95%. Choose a tile to chart it.');
  const tiles = h('div', { class: 'tiles', role: 'list', 'aria-label': 'Overview metrics' });
  const hourAllowed = daysIn(state.from, state.to) <= 7;
  const tools = [
    select('Metric', 'metric', METRICS.map((m) => ({ value: m.name, label: m.label })), chosen.name,
      (e) => ctx.navigate({ extras: { metric: e.target.value } })),
    select('Grain', 'grain', [{ value: 'day', label: 'Daily' }, ...(hourAllowed ? [{ value: 'hour', label: 'Hourly' }] : [])],
      hourAllowed ? state.extras.grain : 'day', (e) => ctx.navigate({ extras: { grain: e.target.value } })),
  ];
  tools[0].querySelector('select').id = 'series-metric';
  tools[1].querySelector('select').id = 'series-grain';
  const prev = previousRange(state.from, state.to);
  const series = ctx.panel({
    id: 'series', title: `${chosen.label} over time`, tools,
    caption: (chosen.hint ? chosen.label + ' is ' + chosen.hint + '. ' : '')
      + 'Dashed lines mark notes on the timeline' + (state.compare ? '; the grey line is the previous period.' : '.'),
    columns: [
      { key: 'at', label: 'Date', format: (v) => (v.length > 10 ? fmt.hour(v) : fmt.date(v)) },
      { key: 'value', label: chosen.label, num: true, format: (v) => formatMetric(fmt, chosen.name, v),
        csv: (r) => r.value },
      { key: 'numerator', label: 'Numerator', num: true, format: (v) => fmt.decimal(v, 0) },
      { key: 'denominator', label: 'Denominator', num: true, format: (v) => fmt.decimal(v, 0) },
      ...(state.compare ? [{ key: 'previousAt', label: 'Previous period date', format: (v) => v ?? '–' },
        { key: 'previousValue', label: 'Previous period', num: true, format: (v) => formatMetric(fmt, chosen.name, v) }]
        : []),
    ],
  });
  const notes = h('section', { class: 'panel notes', 'aria-labelledby': 'notes-title' });
  ctx.main.append(tiles, series.el, notes);

  const [overview, answer, annotations] = await Promise.all([
    metrics(ctx, 'overview', {}, { compare: true }).catch((e) => e),
    metrics(ctx, 'timeseries', { metric: chosen.name, grain: hourAllowed ? state.extras.grain : 'day' }).catch((e) => e),
    ctx.api.get(`/api/v1/sites/${ctx.site.id}/annotations`, `from=${state.from}&to=${state.to}`, ctx.signal)
      .catch((e) => e),
  ]);
  for (const r of [overview, answer, annotations]) if (r?.name === 'AbortError') throw r;

  if (overview instanceof Error) tiles.append(h('p', { class: 'error', role: 'alert', text: overview.message }));
  else {
    showScope(ctx, scope, overview.scope, overview.comparison);
    drawTiles(ctx, tiles, overview, chosen.name);
  }
  const notesList = annotations instanceof Error ? [] : annotations;
  drawNotes(ctx, notes, notesList, annotations instanceof Error ? annotations : null);
  if (answer instanceof Error) series.error(answer);
  else if (!answer.points.some((p) => p.denominator > 0)) series.empty(emptyMessage('sessions'));
  else drawSeries(ctx, series, answer, chosen, notesList, prev);
  loadSparklines(ctx, tiles);
}

function drawTiles(ctx, tiles, overview, chosen) {
  const { fmt } = ctx;
  const changes = overview.comparison?.changes ?? [];
  for (const m of METRICS) {
    const value = overviewValue(overview.current, m.name);
    const ch = changes.find((c) => c.metric === m.name);
    const line = h('span', { class: 'change' });
    let badge = null;
    if (!ch || ch.change === null || ch.change === undefined) line.textContent = 'no earlier data to compare';
    else {
      const arrow = ch.change > 0 ? '▲ ' : ch.change < 0 ? '▼ ' : '';
      let rel = '';
      if (m.kind === 'count' && ch.previous > 0) rel = ` (${fmt.signed((ch.change / ch.previous) * 100, 1)}%)`;
      line.textContent = arrow + formatChange(fmt, m.name, ch.change) + rel;
      if (ch.significant === true) {
        const better = (ch.change < 0) === Boolean(m.lowerIsBetter);
        badge = h('span', { class: 'badge ' + (better ? 'better' : 'worse'),
          text: better ? 'meaningful, better' : 'meaningful, worse' });
      } else {
        line.append(h('span', { class: 'quiet', text: ch.significant === false ? ' · within noise' : ' · not tested' }));
      }
      const iv = ch.lower !== null && ch.lower !== undefined
        ? ` 95% interval ${formatChange(fmt, m.name, ch.lower)} to ${formatChange(fmt, m.name, ch.upper)}.` : '';
      line.title = `Previous period: ${formatMetric(fmt, m.name, ch.previous)}.${iv} Method: ${ch.method ?? 'none'}.`;
    }
    tiles.append(h('div', { role: 'listitem', class: 'tile-cell' }, h('button', {
      type: 'button', class: 'tile' + (m.name === chosen ? ' chosen' : ''), 'aria-pressed': String(m.name === chosen),
      'data-metric': m.name, id: 'tile-' + m.name, onclick: () => ctx.navigate({ extras: { metric: m.name } }),
    }, h('span', { class: 'tile-label', text: m.label }), h('span', { class: 'tile-value', text: formatMetric(fmt, m.name, value) }),
    line, badge, h('canvas', { class: 'spark', 'aria-hidden': 'true', 'data-metric': m.name }))));
  }
}

function drawSeries(ctx, panel, answer, chosen, notes, prev) {
  const { fmt } = ctx;
  const hourly = answer.grain === 'hour';
  const labels = answer.points.map((p) => p.at);
  const rows = answer.points.map((p, i) => ({ ...p, previousAt: answer.previous?.[i]?.at,
    previousValue: answer.previous?.[i]?.value ?? null }));
  const scale = chosen.kind === 'money' ? 1e-6 : chosen.kind === 'rate' ? 100 : chosen.kind === 'duration' ? 1e-3 : 1;
  const lines = notes.map((n) => ({ x: labels.indexOf(hourly ? n.date + 'T00:00' : n.date), color: COLORS.purple,
    label: n.text.length > LABEL_MAX ? n.text.slice(0, LABEL_MAX - 1) + '…' : n.text })).filter((l) => l.x >= 0);
  const datasets = [{ label: `${chosen.label}, ${fmt.range(answer.scope.from, answer.scope.to)}`, borderColor: COLORS.blue,
    backgroundColor: alpha(COLORS.blue, 0.15), data: answer.points.map((p) => (p.value === null ? null : p.value * scale)),
    pointRadius: hourly ? 0 : 2.5, borderWidth: 2, tension: 0, spanGaps: false }];
  if (answer.previous) {
    datasets.push({ label: `Previous period, ${fmt.range(prev.from, prev.to)}`, borderColor: COLORS.muted,
      borderDash: [6, 4], pointRadius: 0, borderWidth: 1.5,
      data: answer.previous.map((p) => (p.value === null ? null : p.value * scale)) });
  }
  const tick = (v) => (chosen.kind === 'money' ? fmt.money(v) : chosen.kind === 'rate' ? fmt.decimal(v, 0) + '%'
    : chosen.kind === 'duration' ? fmt.decimal(v, 0) + ' s' : fmt.count(v));
  panel.show(rows, {
    type: 'line',
    data: { labels: labels.map((l) => (hourly ? fmt.hour(l) : fmt.date(l, { day: 'numeric', month: 'short' }))), datasets },
    options: {
      interaction: { mode: 'index', intersect: false },
      scales: { y: { beginAtZero: chosen.kind !== 'mean', ticks: { callback: tick } }, x: { ticks: { maxTicksLimit: 12 } } },
      plugins: { flGuides: { lines }, tooltip: { callbacks: { label: (c) => `${c.dataset.label}: ${formatMetric(fmt,
        chosen.name, (c.datasetIndex === 1 ? answer.previous : answer.points)[c.dataIndex].value)}` } } },
    },
  }, { label: `${chosen.label} per ${hourly ? 'hour' : 'day'}, ${answer.points.length} points` });
}

function drawNotes(ctx, section, notes, error) {
  const { fmt, state } = ctx;
  const message = h('p', { class: 'form-message', role: 'alert' });
  const dateId = uid('note-date');
  const textId = uid('note-text');
  const date = h('input', { type: 'date', id: dateId, name: 'date', value: state.to, required: true });
  const text = h('input', { type: 'text', id: textId, name: 'text', maxlength: '200', required: true,
    placeholder: 'e.g. new sidebar ad', autocomplete: 'off' });
  const form = h('form', { class: 'note-form', novalidate: true, onsubmit: async (e) => {
    e.preventDefault();
    message.textContent = '';
    if (!text.value.trim()) { message.textContent = 'Write the note first (up to 200 characters).'; text.focus(); return; }
    try {
      await ctx.api.post(`/api/v1/sites/${ctx.site.id}/annotations`, { date: date.value, text: text.value });
      ctx.navigate({});
    } catch (err) {
      message.textContent = err.message;
    }
  } },
  h('label', { class: 'field', for: dateId }, h('span', { text: 'Date' }), date),
  h('label', { class: 'field grow', for: textId }, h('span', { text: 'Note' }), text),
  h('button', { type: 'submit', id: 'add-note', text: 'Add note' }));
  const list = h('ul', { class: 'note-list' }, notes.map((n) => h('li', { 'data-id': String(n.id) },
    h('time', { datetime: n.date, text: fmt.date(n.date) }), ' ',
    h('span', { class: 'note-text', text: n.text }),
    n.createdBy ? h('span', { class: 'quiet', text: ' · ' + n.createdBy }) : null, ' ',
    h('button', { type: 'button', class: 'link', text: 'Delete', 'aria-label': `Delete the note of ${fmt.date(n.date)}`,
      onclick: async () => {
        try { await ctx.api.delete(`/api/v1/sites/${ctx.site.id}/annotations/${n.id}`); ctx.navigate({}); }
        catch (err) { message.textContent = err.message; }
      } }))));
  section.replaceChildren(h('h2', { id: 'notes-title', text: 'Notes on the timeline' }),
    error ? h('p', { class: 'error', role: 'alert', text: error.message })
      : notes.length ? list : h('p', { class: 'quiet', text: 'No notes in this date range. Add one to mark a change such as a new ad slot.' }),
    form, message);
}

async function loadSparklines(ctx, tiles) {
  const queue = [...tiles.querySelectorAll('canvas.spark')];
  const work = async () => {
    for (let c = queue.shift(); c; c = queue.shift()) {
      try {
        const s = await metrics(ctx, 'timeseries', { metric: c.dataset.metric }, { compare: false });
        if (!ctx.stale()) sparkline(c, s.points.map((p) => p.value));
      } catch (e) {
        if (e.name === 'AbortError') return;
        c.title = 'trend not available: ' + e.message;
      }
    }
  };
  await Promise.all([work(), work(), work()]);
}

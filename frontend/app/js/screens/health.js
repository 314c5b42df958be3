// Site health: overview tiles against the previous period, and a time series of any metric with notes.

import { h, select, field, input } from '../dom.js';
import { heading, showScope, metrics, emptyMessage } from '../screen.js';
import { METRICS, metric, overviewValue, formatMetric, formatChange } from '../metrics.js';
import { COLORS, alpha, sparkline } from '../charts.js';
import { daysIn, previousRange, todayIn } from '../range.js';

export const id = 'health';
export const title = 'Health';

export async function render(ctx) {
  const { state, fmt } = ctx;
  const chosen = metric(state.extras.metric);
  const show = (v) => formatMetric(fmt, chosen.name, v);
  const scope = heading(ctx, `${ctx.site.name}: health`, 'Each tile compares this period with the one just before '
    + 'it; a badge marks only changes that are statistically meaningful at 95%. Choose a tile to chart it.');
  const tiles = h('div', { class: 'tiles', role: 'list', 'aria-label': 'Overview metrics' });
  const hourly = daysIn(state.from, state.to) <= 7 && state.extras.grain === 'hour';
  const series = ctx.panel({
    id: 'series', title: `${chosen.label} over time`,
    tools: [
      select('Metric', 'metric', METRICS.map((m) => ({ value: m.name, label: m.label })), chosen.name,
        (e) => ctx.navigate({ extras: { metric: e.target.value } }), 'series-metric'),
      select('Grain', 'grain', [{ value: 'day', label: 'Daily' }, ...(daysIn(state.from, state.to) <= 7
        ? [{ value: 'hour', label: 'Hourly' }] : [])], hourly ? 'hour' : 'day',
      (e) => ctx.navigate({ extras: { grain: e.target.value } }), 'series-grain'),
    ],
    caption: (chosen.hint ? `${chosen.label} is ${chosen.hint}. ` : '') + 'Purple dashed lines mark notes'
      + (state.compare ? '; the grey line is the previous period.' : '.'),
    columns: [
      { key: 'at', label: 'Date', format: (v) => (hourly ? fmt.hour(v) : fmt.date(v)) },
      { key: 'value', label: chosen.label, format: show },
      { key: 'numerator', label: 'Numerator', format: (v) => fmt.decimal(v, 0) },
      { key: 'denominator', label: 'Denominator', format: (v) => fmt.decimal(v, 0) },
      ...(state.compare ? [{ key: 'previousAt', label: 'Previous period date', text: true },
        { key: 'previousValue', label: 'Previous period', format: show }] : []),
    ],
  });
  const notes = h('section', { class: 'panel', 'aria-labelledby': 'notes-title' });
  ctx.main.append(tiles, series.el, notes);

  const caught = (p) => p.catch((e) => { if (e.name === 'AbortError') throw e; return e; });
  const [overview, answer, annotations] = await Promise.all([
    caught(metrics(ctx, 'overview', {}, { compare: true })),
    caught(metrics(ctx, 'timeseries', { metric: chosen.name, grain: hourly ? 'hour' : 'day' })),
    caught(ctx.api.get(`/api/v1/sites/${ctx.site.id}/annotations`, `from=${state.from}&to=${state.to}`, ctx.signal)),
  ]);
  if (overview instanceof Error) tiles.append(h('p', { class: 'error', role: 'alert', text: overview.message }));
  else {
    showScope(ctx, scope, overview.scope, overview.comparison);
    drawTiles(ctx, tiles, overview, chosen.name);
  }
  const noted = annotations instanceof Error ? [] : annotations;
  drawNotes(ctx, notes, noted, annotations instanceof Error ? annotations : null);
  if (answer instanceof Error) series.error(answer);
  else if (!answer.points.some((p) => p.denominator > 0)) series.empty(emptyMessage('sessions'));
  else drawSeries(ctx, series, answer, chosen, noted);
  loadSparklines(ctx, tiles);
}

function drawTiles(ctx, tiles, overview, chosen) {
  const { fmt } = ctx;
  for (const m of METRICS) {
    const ch = overview.comparison?.changes?.find((c) => c.metric === m.name);
    const line = h('span', { class: 'change' });
    let badge = null;
    if (typeof ch?.change !== 'number') line.textContent = 'no earlier data to compare';
    else {
      const rel = m.kind === 'count' && ch.previous > 0 ? ` (${fmt.signed((ch.change / ch.previous) * 100, 1)}%)` : '';
      line.textContent = (ch.change > 0 ? '▲ ' : ch.change < 0 ? '▼ ' : '') + formatChange(fmt, m.name, ch.change) + rel;
      if (ch.significant === true) {
        const better = (ch.change < 0) === Boolean(m.lowerIsBetter);
        badge = h('span', { class: 'badge' + (better ? '' : ' worse'), text: `meaningful, ${better ? 'better' : 'worse'}` });
      } else {
        line.append(h('span', { class: 'quiet', text: ch.significant === false ? ' · within noise' : ' · not tested' }));
      }
      const iv = typeof ch.lower === 'number'
        ? ` 95% interval ${formatChange(fmt, m.name, ch.lower)} to ${formatChange(fmt, m.name, ch.upper)}.` : '';
      line.title = `Previous period: ${formatMetric(fmt, m.name, ch.previous)}.${iv} Method: ${ch.method ?? 'none'}.`;
    }
    tiles.append(h('div', { role: 'listitem' }, h('button', {
      type: 'button', class: 'tile' + (m.name === chosen ? ' chosen' : ''), 'aria-pressed': String(m.name === chosen),
      id: 'tile-' + m.name, onclick: () => ctx.navigate({ extras: { metric: m.name } }),
    }, h('span', { class: 'tile-label', text: m.label }),
    h('span', { class: 'tile-value', text: formatMetric(fmt, m.name, overviewValue(overview.current, m.name)) }),
    line, badge, h('div', { class: 'spark' }, h('canvas', { 'aria-hidden': 'true', 'data-metric': m.name })))));
  }
}

function drawSeries(ctx, panel, answer, chosen, notes) {
  const { fmt } = ctx;
  const hourly = answer.grain === 'hour';
  const labels = answer.points.map((p) => p.at);
  const rows = answer.points.map((p, i) => ({ ...p, previousAt: answer.previous?.[i]?.at,
    previousValue: answer.previous?.[i]?.value ?? null }));
  const values = (points) => points.map((p) => p.value ?? null);
  const partial = labels.findIndex((l) => l.startsWith(todayIn(ctx.site.timezone)));
  const lines = notes.map((n) => ({ x: labels.indexOf(hourly ? n.date + 'T00:00' : n.date), color: COLORS.purple,
    label: n.text.length > 28 ? n.text.slice(0, 27) + '…' : n.text })).filter((l) => l.x >= 0);
  const datasets = [{ label: `${chosen.label}, ${fmt.range(answer.scope.from, answer.scope.to)}`,
    borderColor: COLORS.blue, backgroundColor: alpha(COLORS.blue, 0.15), data: values(answer.points),
    pointRadius: hourly ? 0 : 2.5, borderWidth: 2,
    segment: { borderDash: (g) => (partial >= 0 && g.p1DataIndex >= partial ? [4, 4] : undefined) } }];
  if (answer.previous) {
    const prev = previousRange(answer.scope.from, answer.scope.to);
    datasets.push({ label: `Previous period, ${fmt.range(prev.from, prev.to)}`, borderColor: COLORS.muted,
      borderDash: [6, 4], pointRadius: 0, borderWidth: 1.5, data: values(answer.previous) });
  }
  panel.show(rows, {
    type: 'line',
    data: { labels: labels.map((l) => (hourly ? fmt.hour(l) : fmt.date(l, { day: 'numeric', month: 'short' }))), datasets },
    options: {
      interaction: { mode: 'index', intersect: false },
      scales: { y: { beginAtZero: chosen.kind !== 'mean', ticks: { callback: (v) => formatMetric(fmt, chosen.name, v) } }, x: { ticks: { maxTicksLimit: 12 } } },
      plugins: { flGuides: { lines },
        tooltip: { callbacks: { label: (c) => `${c.dataset.label}: ${formatMetric(fmt, chosen.name, c.parsed.y)}` } } },
    },
  }, { label: `${chosen.label} per ${hourly ? 'hour' : 'day'}, ${answer.points.length} points`,
    note: partial >= 0 ? 'Today is not over yet: its part of the line is dashed.' : '' });
}

function drawNotes(ctx, section, notes, error) {
  const { fmt } = ctx;
  const base = `/api/v1/sites/${ctx.site.id}/annotations`;
  const message = h('p', { class: 'form-message', role: 'alert' });
  const act = (call) => call.then(() => ctx.navigate({}), (err) => { message.textContent = err.message; });
  const date = input({ type: 'date', name: 'date', value: ctx.state.to });
  const text = input({ type: 'text', name: 'text', maxlength: '200', placeholder: 'e.g. new sidebar ad' });
  const form = h('form', { class: 'note-form', novalidate: true, onsubmit: (e) => {
    e.preventDefault();
    if (!text.value.trim()) message.textContent = 'Write the note first (up to 200 characters).';
    else act(ctx.api.post(base, { date: date.value, text: text.value }));
  } },
  field('Date', date), field('Note', text, ' grow'),
  h('button', { type: 'submit', id: 'add-note', text: 'Add note' }));
  const list = h('ul', { class: 'note-list' }, notes.map((n) => h('li', null,
    h('time', { datetime: n.date, text: fmt.date(n.date) }), ' ', h('span', { class: 'note-text', text: n.text }),
    h('span', { class: 'quiet', text: n.createdBy ? ' · ' + n.createdBy + ' ' : ' ' }),
    h('button', { type: 'button', class: 'link', text: 'Delete', 'aria-label': `Delete the note of ${fmt.date(n.date)}`,
      onclick: () => act(ctx.api.delete(`${base}/${n.id}`)) }))));
  section.replaceChildren(h('h2', { id: 'notes-title', text: 'Notes on the timeline' }),
    error ? h('p', { class: 'error', text: error.message }) : notes.length ? list
      : h('p', { class: 'quiet', text: 'No notes in these dates. Add one to mark a change such as a new ad slot.' }),
    form, message);
}

async function loadSparklines(ctx, tiles) {
  const queue = [...tiles.querySelectorAll('canvas')];
  const work = async () => {
    for (let c = queue.shift(); c; c = queue.shift()) {
      const s = await metrics(ctx, 'timeseries', { metric: c.dataset.metric }, { compare: false }).catch((e) => e);
      if (s instanceof Error) {
        if (s.name === 'AbortError') return;
        c.title = 'trend not available: ' + s.message;
      } else if (!ctx.stale()) sparkline(c, s.points.map((p) => p.value));
    }
  };
  await Promise.all([work(), work(), work()]);
}

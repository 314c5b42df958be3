// Site health: overview tiles against the previous period, and a time series of any metric with notes.

import { h, select } from '../dom.js';
import { heading, showScope, metrics, emptyMessage } from '../screen.js';
import { METRICS, metric, overviewValue, formatMetric, formatChange } from '../metrics.js';
import { COLORS, sparkline } from '../charts.js';
import { daysIn, previousRange, todayIn } from '../range.js';
import { form, action } from '../manage.js';

export const id = 'health';
export const title = 'Health';

export async function render(ctx) {
  const { state, fmt } = ctx;
  const chosen = metric(state.extras.metric);
  const show = (v) => formatMetric(fmt, chosen.name, v);
  const scope = heading(ctx, `${ctx.site.name}: health`, 'Each tile against the period before; a badge marks changes '
    + 'meaningful at 95%. Choose a tile to chart it.');
  const tiles = h('div.tiles', { role: 'list', 'aria-label': 'Overview metrics' });
  // hours for ranges of up to 7 days (the API's limit), days otherwise
  const week = daysIn(state.from, state.to) <= 7;
  const hourly = week && state.extras.grain === 'hour';
  const when = (v) => (hourly ? fmt.hour(v) : fmt.date(v));
  const series = ctx.panel({
    id: 'series', title: `${chosen.label} over time`,
    tools: [select('Metric', 'metric', METRICS.map((m) => ({ value: m.name, label: m.label })), chosen.name,
      (e) => ctx.navigate({ extras: { metric: e.target.value } }), 'series-metric'),
    select('Grain', 'grain', [['day', 'Daily'], ...(week ? [['hour', 'Hourly']] : [])]
      .map(([value, label]) => ({ value, label })), hourly ? 'hour' : 'day',
    (e) => ctx.navigate({ extras: { grain: e.target.value } }), 'series-grain')],
    caption: (chosen.hint ? `${chosen.label} is ${chosen.hint}. ` : '') + 'Purple dashed lines mark notes'
      + (state.compare ? '; the grey line is the previous period.' : '.'),
    columns: [['at', hourly ? 'Hour' : 'Date', when], ['value', chosen.label, show],
      ['numerator', 'Numerator', 'count'], ['denominator', 'Denominator', 'count'],
      ...(state.compare ? [['previousAt', 'Previous period date', null, { text: true }],
        ['previousValue', 'Previous period', show]] : [])],
  });
  const notes = h('section.panel', { 'aria-labelledby': 'notes-title' });
  ctx.main.append(tiles, series.el, notes);

  const caught = (p) => p.catch((e) => { if (e.name === 'AbortError') throw e; return e; });
  const [overview, answer, annotations] = await Promise.all([
    caught(metrics(ctx, 'overview', {}, { compare: true })),
    caught(metrics(ctx, 'timeseries', { metric: chosen.name, grain: hourly ? 'hour' : 'day' })),
    caught(ctx.api.get(`/api/v1/sites/${ctx.site.id}/annotations`, `from=${state.from}&to=${state.to}`, ctx.signal)),
  ]);
  if (overview instanceof Error) tiles.append(h('p.error', { text: overview.message, role: 'alert' }));
  else {
    showScope(ctx, scope, overview.scope, overview.comparison);
    drawTiles(ctx, tiles, overview, chosen.name);
  }
  const failed = annotations instanceof Error;
  drawNotes(ctx, notes, failed ? [] : annotations, failed && annotations);
  if (answer instanceof Error) series.error(answer);
  else if (!answer.points.some((p) => p.denominator > 0)) series.empty(emptyMessage('sessions'));
  else drawSeries(ctx, series, answer, chosen, failed ? [] : annotations);
  trends(ctx, tiles);
}

// each tile's small trend line: the metric per day over the same dates, three requests at a time, after the chart
async function trends(ctx, tiles) {
  const queue = [...tiles.querySelectorAll('canvas')];
  const work = async () => {
    for (let c = queue.shift(); c && !ctx.signal.aborted; c = queue.shift()) {
      const s = await metrics(ctx, 'timeseries', { metric: c.dataset.metric }, { compare: false }).catch((e) => e);
      if (s.name === 'AbortError') return;
      if (s instanceof Error) c.title = 'Trend not available: ' + s.message;
      else if (!ctx.signal.aborted) sparkline(c, s.points.map((p) => p.value ?? null));
    }
  };
  await Promise.all([work(), work(), work()]);
}

function drawTiles({ fmt, navigate }, tiles, overview, chosen) {
  for (const m of METRICS) {
    const ch = overview.comparison?.changes?.find((c) => c.metric === m.name);
    const line = h('span.change', 'no earlier data to compare');
    let badge = '';
    if (typeof ch?.change === 'number') {
      const rel = m.kind === 'count' && ch.previous > 0 ? ` (${fmt.signed((ch.change / ch.previous) * 100, 1)}%)` : '';
      line.textContent = (ch.change > 0 ? '▲ ' : ch.change < 0 ? '▼ ' : '') + formatChange(fmt, m.name, ch.change) + rel;
      const iv = typeof ch.lower === 'number'
        ? ` 95% interval ${formatChange(fmt, m.name, ch.lower)} to ${formatChange(fmt, m.name, ch.upper)}.` : '';
      line.title = `Previous period: ${formatMetric(fmt, m.name, ch.previous)}.${iv} Method: ${ch.method ?? 'none'}.`;
      if (ch.significant) {
        const better = (ch.change < 0) === !!m.lowerIsBetter;
        badge = h('span.badge', { class: better ? '' : 'worse', text: `meaningful, ${better ? 'better' : 'worse'}` });
      } else {
        line.append(h('span.quiet', ch.significant === false ? ' · within noise' : ' · not tested'));
      }
    }
    tiles.append(h('div', { role: 'listitem' }, h('button.tile', { 'aria-pressed': String(m.name === chosen),
      id: 'tile-' + m.name, onclick: () => navigate({ extras: { metric: m.name } }) }, h('span.tile-label', m.label),
    h('span.tile-value', formatMetric(fmt, m.name, overviewValue(overview.current, m.name))),
    line, badge, h('div.spark', null, h('canvas', { 'aria-hidden': 'true', 'data-metric': m.name })))));
  }
}

function drawSeries(ctx, panel, answer, chosen, notes) {
  const { fmt } = ctx;
  const show = (v) => formatMetric(fmt, chosen.name, v);
  const points = answer.points;
  const labels = points.map((p) => p.at);
  const values = (list) => list.map((p) => p.value ?? null);
  const partial = labels.findIndex((l) => l.startsWith(todayIn(ctx.site.timezone)));
  const hourly = answer.grain === 'hour';
  const lines = notes.map((n) => ({ x: labels.indexOf(hourly ? n.date + 'T00:00' : n.date), color: COLORS.purple,
    label: n.text.length > 28 ? n.text.slice(0, 27) + '…' : n.text })).filter((l) => l.x >= 0);
  const datasets = [{ label: `${chosen.label}, ${fmt.range(answer.scope.from, answer.scope.to)}`,
    borderColor: COLORS.blue, backgroundColor: COLORS.blue + '26', data: values(points),
    pointRadius: hourly ? 0 : 2.5, borderWidth: 2,
    // today is not over: its part of the line is dashed
    segment: { borderDash: (g) => (partial >= 0 && g.p1DataIndex >= partial ? [4, 4] : undefined) } }];
  if (answer.previous) {
    const prev = previousRange(answer.scope.from, answer.scope.to);
    datasets.push({ label: `Previous period, ${fmt.range(prev.from, prev.to)}`, borderColor: COLORS.muted,
      borderDash: [6, 4], pointRadius: 0, borderWidth: 1.5, data: values(answer.previous) });
  }
  panel.show(points.map((p, i) => ({ ...p, previousAt: answer.previous?.[i]?.at,
    previousValue: answer.previous?.[i]?.value })), {
    type: 'line',
    data: { labels: labels.map((l) => (hourly ? fmt.hour(l) : fmt.date(l, { day: 'numeric', month: 'short' }))),
      datasets },
    options: {
      interaction: { mode: 'index', intersect: false },
      scales: { y: { beginAtZero: chosen.kind !== 'mean', ticks: { callback: show } },
        x: { ticks: { maxTicksLimit: 12 } } },
      plugins: { flGuides: { lines },
        tooltip: { callbacks: { label: (c) => `${c.dataset.label}: ${show(c.parsed.y)}` } } },
    },
  }, { label: `${chosen.label} per ${hourly ? 'hour' : 'day'}, ${points.length} points`,
    note: partial >= 0 ? 'Today is not over yet: its part of the line is dashed.' : '' });
}

function drawNotes(ctx, section, notes, error) {
  const { fmt } = ctx;
  const base = `/api/v1/sites/${ctx.site.id}/annotations`;
  const reload = () => ctx.navigate({});
  section.replaceChildren(h('h2#notes-title', 'Notes on the timeline'),
    error ? h('p.error', error.message) : notes.length ? h('ul.note-list', null,
      notes.map((n) => h('li', null, h('time', { datetime: n.date, text: fmt.date(n.date) }), ' ',
        h('span.note-text', n.text), ' ',
        action('Delete', `Delete the note of ${fmt.date(n.date)}`, () => ctx.api.delete(`${base}/${n.id}`), reload))))
      : h('p.quiet', 'No notes in these dates.'),
    form('note-form', 'Add note', [['date', 'Date', 'date', ctx.state.to],
      ['text', 'Note', 'text', '', { maxlength: 200, size: 50, placeholder: 'e.g. new sidebar ad' }]],
    (v) => ctx.api.post(base, v), reload));
}


// Alerts (issue #7, docs/alerts.md): the site's rules and where they stand, the notifications with acknowledge and
// mute, "try this rule on the last 30 days" (a back-test drawn on the time series chart, with the count), and the
// possible jumps found by CUSUM, each with a button that turns it into a rule.
//
// To show it, the shell registers the module: `import * as alerts from 'app/screens/alerts.js'` in main.js's
// SCREENS, and 'alerts' in state.js's SCREENS. It uses only the shell's ctx, dom.js, screen.js and charts.js.

import { h, field, input, select } from '../dom.js';
import { heading } from '../screen.js';
import { COLORS, alpha } from '../charts.js';

export const id = 'alerts';
export const title = 'Alerts';

const METRICS = [
  { value: 'bounceRate', label: 'Bounce rate', proportion: true },
  { value: 'pagesPerSession', label: 'Pages per session', proportion: false },
  { value: 'sessionRpm', label: 'Session RPM', proportion: false },
  { value: 'viewabilityRate', label: 'Viewability rate', proportion: true },
  { value: 'ctr', label: 'CTR', proportion: true },
];
const STATE_WORDS = {
  CALM: 'Calm', RAISED: 'Raised', EASING: 'Easing', PAUSED: 'Paused',
};
const STATE_HINTS = {
  CALM: 'nothing to report',
  RAISED: 'in breach; the notice went out',
  EASING: 'the condition has gone; waiting for "clears after" before calling it over',
  PAUSED: 'switched off: not evaluated',
};

export async function render(ctx) {
  const base = `/api/v1/sites/${ctx.site.id}/alerts`;
  const scope = heading(ctx, `${ctx.site.name}: alerts`, 'Rules judge the newest complete hour of the rollups every '
    + 'hour; a jump raises a rule once and its recovery clears it once. Try a rule on the last 30 days before '
    + 'saving it.');
  scope.textContent = `Times in the site's time zone, ${ctx.site.timezone}`;
  const rulesBox = section('rules', 'Rules');
  const noticesBox = section('notifications', 'Notifications');
  const tryBox = section('backtest', 'Try a rule on history');
  const jumpsBox = section('suggestions', 'Possible jumps in the hourly bounce rate');
  ctx.main.append(noticesBox.el, rulesBox.el, tryBox.el, jumpsBox.el);

  const refresh = async () => {
    if (ctx.stale()) return;
    await Promise.all([drawRules(ctx, base, rulesBox, refresh), drawNotices(ctx, base, noticesBox, refresh)]);
  };
  drawTry(ctx, base, tryBox, refresh);
  await Promise.all([refresh(), drawJumps(ctx, base, jumpsBox, tryBox, refresh)]);
}

function section(key, text) {
  const body = h('div', { class: 'panel-body', id: `alerts-${key}` });
  const status = h('div', { class: 'panel-status', role: 'status' });
  const el = h('section', { class: 'panel', id: `panel-alerts-${key}`, 'aria-labelledby': `alerts-${key}-title` },
    h('header', { class: 'panel-head' }, h('h2', { id: `alerts-${key}-title`, text })), status, body);
  return {
    el, body,
    status(message, alert = false) {
      status.replaceChildren(message ?? '');
      status.hidden = !message;
      status.setAttribute('role', alert ? 'alert' : 'status');
    },
  };
}

function failed(box, e) {
  if (e.name === 'AbortError') throw e;
  box.status(e.message || String(e), true);
}

async function drawRules(ctx, base, box, refresh) {
  let rules;
  try {
    rules = await ctx.api.get(base + '/rules', null, ctx.signal);
  } catch (e) {
    failed(box, e);
    return;
  }
  box.status(rules.length ? '' : 'No rules yet. Try one below, or start from a possible jump.');
  box.body.replaceChildren(rules.length ? h('table', { class: 'data', id: 'alert-rules' },
    h('thead', null, h('tr', null, ['Rule', 'State', 'Newest window', 'Value', ''].map((t, i) =>
      h('th', { scope: 'col', class: i === 3 ? 'num' : null, text: t })))),
    h('tbody', null, rules.map((r) => ruleRow(ctx, base, r, refresh)))) : '');
}

function ruleRow(ctx, base, r, refresh) {
  const e = r.lastEvaluation;
  const act = (label, path, body) => h('button', { type: 'button', class: 'tool', text: label,
    onclick: async () => {
      try { await ctx.api.post(`${base}/rules/${r.id}/${path}`, body); await refresh(); } catch (err) { alert(err.message); }
    } });
  const until = new Date(Date.now() + 8 * 3600_000).toISOString().replace(/\.\d+Z$/, 'Z');
  const muted = r.mutedUntil && new Date(r.mutedUntil) > new Date();
  return h('tr', { 'data-rule': String(r.id), 'data-state': r.state },
    h('th', { scope: 'row' }, h('strong', { text: r.definition.name }), h('br'),
      h('span', { class: 'muted', text: r.description })),
    h('td', null, h('span', { class: 'badge' + (r.state === 'RAISED' ? ' worse' : ''), text: STATE_WORDS[r.state],
      title: STATE_HINTS[r.state] }), muted ? h('span', { class: 'muted', text: ' muted' }) : null),
    h('td', { text: r.lastWindowEnd ? ctx.fmt.hour(r.lastWindowEnd.slice(0, 16)) : '–' }),
    h('td', { class: 'num', text: e ? `${value(ctx, r.definition.metric, e.observed)} (${e.verdict.toLowerCase()})`
      : '–', title: e?.reason ?? '' }),
    h('td', null,
      r.state === 'PAUSED' ? act('Resume', 'resume') : act('Pause', 'pause'),
      muted ? h('button', { type: 'button', class: 'tool', text: 'Unmute', onclick: async () => {
        try { await ctx.api.delete(`${base}/rules/${r.id}/mute`); await refresh(); } catch (err) { alert(err.message); }
      } }) : act('Mute 8 h', 'mute', { until }),
      h('button', { type: 'button', class: 'tool', text: 'Delete', onclick: async () => {
        if (!confirm(`Delete the rule "${r.definition.name}" and its history?`)) return;
        try { await ctx.api.delete(`${base}/rules/${r.id}`); await refresh(); } catch (err) { alert(err.message); }
      } })));
}

async function drawNotices(ctx, base, box, refresh) {
  let list;
  try {
    list = await ctx.api.get(base + '/notifications', 'limit=20', ctx.signal);
  } catch (e) {
    failed(box, e);
    return;
  }
  const unread = list.filter((n) => !n.acknowledgedAt && !n.muted).length;
  box.status(list.length ? `${unread} unread` : 'No notifications yet.');
  box.body.replaceChildren(h('ul', { class: 'alert-notices', id: 'alert-notifications' }, list.map((n) => {
    const p = safeJson(n.payload);
    return h('li', { 'data-notification': String(n.id), 'data-unread': String(!n.acknowledgedAt && !n.muted) },
      h('strong', { text: n.title }), ' ',
      h('span', { class: 'muted', text: `${ctx.fmt.hour(n.windowEnd.slice(0, 16))}${n.muted ? ' · muted' : ''}` }),
      p?.verdict ? h('p', { class: 'caption', text: p.verdict }) : null,
      p?.link ? h('a', { href: p.link, text: 'Open the matching view' }) : null, ' ',
      n.acknowledgedAt ? h('span', { class: 'muted', text: `acknowledged by ${n.acknowledgedBy ?? 'someone'}` })
        : h('button', { type: 'button', class: 'tool', text: 'Acknowledge', onclick: async () => {
          try { await ctx.api.post(`${base}/notifications/${n.id}/acknowledge`); await refresh(); } catch (err) { alert(err.message); }
        } }));
  })));
}

/** The rule form, the back-test chart and its changes; `fill(rule)` puts a rule (e.g. a suggestion) in the form. */
function drawTry(ctx, base, box, refresh) {
  const name = input({ name: 'rule-name', value: 'Bounce rate jump', required: true });
  const metricSel = select('Metric', 'rule-metric', METRICS.map((m) => ({ value: m.value, label: m.label })),
    'bounceRate', null, 'rule-metric');
  const typeSel = select('Condition', 'rule-type', [{ value: 'jump', label: 'Jump against a baseline' },
    { value: 'above', label: 'Above a threshold' }, { value: 'below', label: 'Below a threshold' }], 'jump', null,
  'rule-type');
  const amount = input({ name: 'rule-amount', type: 'number', step: 'any', value: '5', required: true });
  const windowSel = select('Window', 'rule-window', ['PT1H', 'PT3H', 'PT6H', 'PT24H'].map((w) =>
    ({ value: w, label: w.replace('PT', '').replace('H', ' h') })), 'PT1H', null, 'rule-window');
  const baselineSel = select('Baseline', 'rule-baseline', [{ value: 'trailingDays', label: 'Same hours, last 7 days' },
    { value: 'sameHourOfWeek', label: 'Same hours of the week, last 4 weeks' }], 'trailingDays', null, 'rule-baseline');
  const minSessions = input({ name: 'rule-min-sessions', type: 'number', min: '1', value: '200' });
  const confidence = input({ name: 'rule-confidence', type: 'number', step: '0.001', min: '0.5', max: '0.9999',
    value: '0.99' });
  const amountLabel = field('Change (points; % for means)', amount);
  const form = h('form', { class: 'inline-form', id: 'alert-rule-form' },
    field('Name', name), metricSel, typeSel, amountLabel, windowSel, baselineSel,
    field('Minimum sessions', minSessions), field('Confidence', confidence),
    h('button', { type: 'submit', id: 'alert-try', text: 'Try on the last 30 days' }),
    h('button', { type: 'button', class: 'tool', id: 'alert-save', text: 'Save rule', onclick: () => save() }));
  const canvas = h('canvas', { role: 'img', 'aria-label': 'Back-test: the metric and its baseline per window',
    id: 'chart-alert-backtest' });
  const chartBox = h('div', { class: 'chart-box', hidden: true }, canvas);
  const changes = h('ol', { id: 'alert-backtest-changes' });
  box.body.replaceChildren(form, chartBox, changes);
  box.status('Segment: the reader filters above apply.');

  const metricOf = () => form.querySelector('#rule-metric').value;
  const rule = () => {
    const type = form.querySelector('#rule-type').value;
    const n = Number(amount.value);
    const segment = ctx.state.filters ?? {};
    return {
      name: name.value, metric: metricOf(), segment, window: form.querySelector('#rule-window').value,
      condition: type === 'jump'
        ? { type, by: n, baseline: form.querySelector('#rule-baseline').value }
        : { type, threshold: METRICS.find((m) => m.value === metricOf()).proportion ? n / 100 : n },
      guard: { minSessions: Number(minSessions.value), confidence: Number(confidence.value) },
    };
  };
  form.querySelector('#rule-type').addEventListener('change', (e) => {
    amountLabel.querySelector('span').textContent = e.target.value === 'jump' ? 'Change (points; % for means)'
      : 'Threshold (% for rates)';
  });
  async function save() {
    try {
      await ctx.api.post(base + '/rules', rule());
      box.status('Saved. It is judged from the newest complete hour on.');
      await refresh();
    } catch (e) {
      failed(box, e);
    }
  }
  form.addEventListener('submit', async (ev) => {
    ev.preventDefault();
    box.status('Replaying…');
    let result;
    try {
      result = await ctx.api.post(base + '/backtest', { rule: rule() });
    } catch (e) {
      failed(box, e);
      return;
    }
    const m = metricOf();
    box.status(`${result.raised} notification${result.raised === 1 ? '' : 's'} in ${result.windows} hourly windows`
      + ` (${result.cleared} recover${result.cleared === 1 ? 'y' : 'ies'}`
      + (result.raisedQuietly ? `, ${result.raisedQuietly} kept quiet by the cool-down` : '') + ').');
    chartBox.hidden = false;
    drawBacktest(ctx, canvas, result, m);
    changes.replaceChildren(...result.changes.map((c) => h('li', null,
      h('strong', { text: `${ctx.fmt.hour(c.windowEnd.slice(0, 16))}: ${STATE_WORDS[c.from]} → ${STATE_WORDS[c.to]}` }),
      c.notice ? ` (${c.notice.toLowerCase()} notice)` : '', ' ', h('span', { class: 'muted', text: c.reason }))));
  });
  box.fill = (r) => {
    name.value = r.name;
    form.querySelector('#rule-metric').value = r.metric;
    form.querySelector('#rule-type').value = r.condition.type;
    amount.value = String(r.condition.by);
    form.querySelector('#rule-window').value = ['PT1H', 'PT3H', 'PT6H', 'PT24H'].includes(r.window) ? r.window : 'PT24H';
    form.querySelector('#rule-baseline').value = r.condition.baseline;
    box.el.scrollIntoView({ block: 'start' });
  };
}

function drawBacktest(ctx, canvas, result, metricName) {
  const labels = result.points.map((p) => p.windowEnd.slice(0, 16));
  const raisedAt = new Set(result.changes.filter((c) => c.notice === 'RAISED').map((c) => c.windowEnd.slice(0, 16)));
  const clearedAt = new Set(result.changes.filter((c) => c.notice === 'CLEARED').map((c) => c.windowEnd.slice(0, 16)));
  const marks = (set) => result.points.map((p) => (set.has(p.windowEnd.slice(0, 16)) ? p.observed : null));
  window.Chart?.getChart(canvas)?.destroy();
  const chart = new window.Chart(canvas, {
    type: 'line',
    data: { labels, datasets: [
      { label: 'Window', data: result.points.map((p) => p.observed), borderColor: COLORS.blue, pointRadius: 0,
        borderWidth: 1.2, spanGaps: false },
      { label: 'Baseline', data: result.points.map((p) => p.baseline), borderColor: COLORS.muted, pointRadius: 0,
        borderDash: [4, 3], borderWidth: 1 },
      { label: 'Raised', data: marks(raisedAt), type: 'scatter', backgroundColor: COLORS.vermillion,
        pointRadius: 6, pointStyle: 'triangle' },
      { label: 'Cleared', data: marks(clearedAt), type: 'scatter', backgroundColor: alpha(COLORS.green, 0.9),
        pointRadius: 5 },
    ] },
    options: { animation: false, maintainAspectRatio: false,
      scales: { x: { ticks: { maxTicksLimit: 10, callback: (v) => ctx.fmt.hour(labels[v]) } },
        y: { ticks: { callback: (v) => value(ctx, metricName, v) } } },
      plugins: { tooltip: { callbacks: { title: (items) => ctx.fmt.hour(labels[items[0].dataIndex]),
        label: (c) => `${c.dataset.label}: ${value(ctx, metricName, c.parsed.y)}` } } } },
  });
  canvas.dataset.points = String(result.points.length);
  canvas.dataset.raised = String(result.raised);
  return chart;
}

async function drawJumps(ctx, base, box, tryBox, refresh) {
  let answer;
  const query = new URLSearchParams({ days: '14' });
  for (const [k, values] of Object.entries(ctx.state.filters ?? {})) values.forEach((v) => query.append(k, v));
  try {
    answer = await ctx.api.get(base + '/suggestions', query.toString(), ctx.signal);
  } catch (e) {
    failed(box, e);
    return;
  }
  box.status(answer.suggestions.length ? '' : (answer.notice ?? 'No jump stands out in the last 14 days.'));
  box.body.replaceChildren(h('p', { class: 'caption', text: 'Method: ' + answer.method + '.' }),
    h('ul', { id: 'alert-suggestions' }, answer.suggestions.map((s) => h('li', null,
      h('strong', { text: `${s.direction === 'up' ? 'Rise' : 'Fall'} from ${ctx.fmt.hour(s.startedAt.slice(0, 16))}` }),
      `: ${ctx.fmt.percent(s.expectedRate)} expected, ${ctx.fmt.percent(s.observedRate)} seen `
        + `(${ctx.fmt.points(s.changePercentagePoints / 100)}, ${ctx.fmt.count(s.sessionsSince)} sessions). `,
      h('button', { type: 'button', class: 'tool', text: 'Try as a rule', onclick: () => tryBox.fill(s.suggestedRule) }),
      ' ',
      h('button', { type: 'button', class: 'tool', text: 'Save as a rule', onclick: async () => {
        try { await ctx.api.post(base + '/rules', s.suggestedRule); await refresh(); } catch (err) { failed(box, err); }
      } })))));
}

function value(ctx, metricName, v) {
  if (v === null || v === undefined) return '–';
  const m = METRICS.find((x) => x.value === metricName);
  if (m?.proportion) return ctx.fmt.percent(v);
  if (metricName === 'sessionRpm') return ctx.fmt.money(v / 1e6);
  return ctx.fmt.decimal(v, 2);
}

function safeJson(text) {
  try { return JSON.parse(text); } catch { return null; }
}

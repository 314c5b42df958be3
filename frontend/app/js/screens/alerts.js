// Alerts (issue #7, docs/alerts.md): the notifications with acknowledge; the site's rules with their state, pause,
// mute and delete; the rule form with "try on the last 30 days" (the back-test drawn on the time series with where
// the rule would have been raised and cleared, and the count); the possible jumps, each of which can become a rule.

import { h } from '../dom.js';
import { heading } from '../screen.js';
import { form, table, section, action, ok } from '../manage.js';
import { COLORS } from '../charts.js';
import { sentence } from '../verdict.js';
import { METRICS, STATES, toFields, toRule, metricValue } from '../rules.js';

export const id = 'alerts';
export const title = 'Alerts';

const MUTE = [['', 'Mute for…'], [1, '1 hour'], [8, '8 hours'], [24, '1 day'], [168, '7 days']];
const FIELDS = [['name', 'Name'], ['metric', 'Metric', METRICS],
  ['segment', 'Readers (e.g. device=phone; country=PT,ES)'], ['window', 'Window (hours)', 'number'],
  ['condition.type', 'Condition', [['jump', 'jump from baseline'], 'above', 'below']],
  ['condition.threshold', 'Threshold (%, or currency for RPM)', 'number'],
  ['condition.direction', 'Direction', [['', 'the worse way'], 'up', 'down']],
  ['condition.by', 'By at least (points, or % for means)', 'number'],
  ['condition.baseline', 'Baseline', [['trailingDays', 'same hours, previous days'],
    ['sameHourOfWeek', 'same hours, previous weeks']]],
  ['condition.baselinePeriods', 'Baseline days or weeks', 'number'],
  ['guard.minSessions', 'Minimum sessions', 'number'], ['guard.confidence', 'Confidence (e.g. 0.99)', 'number'],
  ['cooldown', 'Cool-down (hours)', 'number'], ['clearsAfter', 'Clears after (hours)', 'number'],
  ['paused', 'Paused', 'checkbox']];

export function render(ctx) {
  const { api, fmt, signal } = ctx;
  const base = `/api/v1/sites/${ctx.site.id}/alerts`;
  const editor = ctx.can('EDITOR');
  // the API's local date-times of the site, shown as written
  const at = (t) => fmt.when(t);
  const muted = (r) => new Date(r.mutedUntil) > Date.now();
  let editing = null;
  let rulesReload;
  let formReload;
  let tried;
  heading(ctx, `${ctx.site.name}: alerts`, 'A jump raises a rule once, its recovery clears it once. Windows are in '
    + `the site's time zone (${ctx.site.timezone}), other times in yours.`);

  const edit = (rule) => {
    editing = rule;
    formReload().then(() => document.querySelector('#rule-form [name=name]').focus());
  };

  // a rule's state changes with the values behind them, read when opened
  const history = (r) => {
    const box = h('details.history', null, h('summary', 'History'));
    box.addEventListener('toggle', async () => {
      if (!box.open || box.dataset.loaded) return;
      box.dataset.loaded = 'true';
      const list = await api.get(`${base}/rules/${r.id}/history`, 'limit=20', signal).catch((e) => e);
      box.append(list instanceof Error ? h('p.error', list.message) : table('history-' + r.id, [
        ['Window ends', (c) => at(c.windowEnd)], ['Change', (c) => `${STATES[c.from][0]} → ${STATES[c.to][0]}`],
        ['Value', (c) => metricValue(fmt, r.definition.metric, c.observed)], ['Why', (c) => c.reason]],
      list, 'No changes yet.'));
    });
    return box;
  };

  const notices = section(ctx, 'Notifications', async (reload) => {
    const list = await api.get(base + '/notifications', 'limit=50', signal);
    const again = () => (ctx.unread(), reload());
    return table('alert-notifications', [
      ['Notice', (n) => {
        const p = JSON.parse(n.payload) ?? {};
        return [h('strong', n.title), h('div.quiet', p.verdict), p.link && h('a', { href: new URL(p.link).search,
          text: 'Open the matching view' })];
      }],
      ['Window ends', (n) => at(n.windowEnd)],
      ['Read', (n) => (n.acknowledgedAt ? `by ${n.acknowledgedBy}, ${fmt.when(n.acknowledgedAt)}`
        : n.muted ? 'muted' : editor ? action('Acknowledge', 'Acknowledge ' + n.title,
          () => api.post(`${base}/notifications/${n.id}/acknowledge`), again) : 'unread')],
    ], list, 'None yet.');
  });

  const rules = section(ctx, 'Rules', async (reload) => {
    rulesReload = reload;
    return table('alert-rules', [
      ['Rule', (r) => [h('strong', r.definition.name), h('div.quiet', r.description), history(r)]],
      ['State', (r) => [h('span.badge', { class: r.state === 'RAISED' && 'worse', text: STATES[r.state][0] }),
        r.stateSince && ` since ${at(r.stateSince)}`, h('div.quiet', STATES[r.state][1]),
        muted(r) && h('div', `Muted until ${fmt.when(r.mutedUntil)}`)]],
      ['Newest window', (r) => {
        const e = r.lastEvaluation;
        return e ? [`${at(e.windowEnd)}: ${metricValue(fmt, r.definition.metric, e.observed)}`,
          h('div.quiet', e.reason)] : 'not judged yet';
      }],
      ['', (r) => {
        const url = `${base}/rules/${r.id}`;
        const name = r.definition.name;
        return editor && [h('button.link', { text: 'Edit', 'aria-label': 'Edit ' + name, onclick: () => edit(r) }),
          r.state === 'PAUSED' ? action('Resume', 'Resume ' + name, () => api.post(url + '/resume'), reload)
            : action('Pause', 'Pause ' + name, () => api.post(url + '/pause'), reload),
          muted(r) ? action('Unmute', 'Unmute ' + name, () => api.delete(url + '/mute'), reload)
            : h('select.tool', { 'aria-label': 'Mute ' + name, onchange: (e) => api.put(url + '/mute',
              { until: new Date(Date.now() + e.target.value * 36e5).toISOString() })
              .then(() => reload(), (err) => e.target.replaceWith(h('span.error', err.message))) },
            MUTE.map(([value, text]) => h('option', { value, text }))),
          action('Delete', 'Delete ' + name, () => confirm(`Delete the rule “${name}” and its history?`)
            && api.delete(url), reload)];
      }],
    ], await api.get(base + '/rules', null, signal), 'No rules yet: write one below, or make one of a possible jump.');
  });

  const test = ctx.panel({ id: 'backtest', title: 'Try the rule on the last 30 days',
    caption: 'The metric per window, its baseline (dashed), where the rule would have been raised (▲) and cleared (●).',
    columns: [['windowEnd', 'Window ends', at], ['observed', 'Value', (v) => metricValue(fmt, tried.rule.metric, v)],
      ['baseline', 'Baseline', (v) => metricValue(fmt, tried.rule.metric, v)], ['sessions', 'Sessions', 'count'],
      ['verdict', 'Verdict', null, { text: true }]] });
  test.empty('Write a rule above and choose “Try on the last 30 days”.');

  function drawTest(r) {
    tried = r;
    const m = r.rule.metric;
    const pick = (k) => r.points.map((p) => p[k]);
    const labels = pick('windowEnd');
    const marks = (kind) => r.points.map((p) => (r.changes.some((c) => c.notice === kind
      && c.windowEnd === p.windowEnd) ? p.observed : null));
    const line = (label, data, color, more) => ({ label, data, borderColor: color, backgroundColor: color,
      pointRadius: 0, borderWidth: 1.5, ...more });
    const threshold = r.rule.condition.threshold;
    test.show(r.points, { type: 'line', data: { labels, datasets: [line('Value', pick('observed'), COLORS.blue),
      line('Baseline', pick('baseline'), COLORS.muted, { borderDash: [4, 3] }),
      line('Raised', marks('RAISED'), COLORS.vermillion, { showLine: false, pointRadius: 8, pointStyle: 'triangle' }),
      line('Cleared', marks('CLEARED'), COLORS.green, { showLine: false, pointRadius: 6 })] },
    options: { scales: { x: { ticks: { maxTicksLimit: 8, maxRotation: 0,
      callback: (i) => fmt.date(labels[i], { day: 'numeric', month: 'short' }) } },
    y: { ticks: { callback: (v) => metricValue(fmt, m, v) } } },
    plugins: { flGuides: { lines: threshold == null ? [] : [{ y: threshold, label: 'threshold' }] },
      tooltip: { callbacks: { title: ([c]) => at(labels[c.dataIndex]),
        label: (c) => `${c.dataset.label}: ${metricValue(fmt, m, c.parsed.y)}` } } } } },
    { label: 'Back-test: ' + r.description, note: h('strong#backtest-count', `${r.raised} raised, ${r.cleared} `
      + `cleared in ${r.windows} hourly windows` + (r.raisedQuietly ? `, ${r.raisedQuietly} more kept quiet` : '')) });
  }

  const rule = editor && section(ctx, 'Write a rule', async (reload) => {
    formReload = reload;
    const f = toFields(editing?.definition);
    const el = form('rule-form', editing?.id ? 'Save changes' : 'Save rule', FIELDS.map(([n, l, t]) => [n, l, t, f[n]]),
      (v, button) => {
        const body = toRule(v, editing?.definition);
        return button.name === 'try' ? api.post(base + '/backtest', { rule: body })
          : editing?.id ? api.put(`${base}/rules/${editing.id}`, body) : api.post(base + '/rules', body);
      }, (x) => (x.points ? drawTest(x) : (editing = null, rulesReload(), reload(ok(`Saved “${x.definition.name}”.`)))),
      [h('button.tool', { type: 'submit', name: 'try', text: 'Try on the last 30 days' }),
        editing && h('button.link', { text: 'New rule instead', onclick: () => edit(null) })]);
    // a threshold for "above" and "below", the jump's fields for a jump
    const type = el.elements['condition.type'];
    (type.onchange = () => {
      for (const c of el.querySelectorAll('[name^="condition."]')) {
        if (c !== type) c.closest('label').hidden = (c.name === 'condition.threshold') === (type.value === 'jump');
      }
    })();
    return [h('p.quiet', editing?.id ? `Changing “${editing.definition.name}”.` : editing ? 'From a possible jump.'
      : 'A new rule; try it on the last 30 days before saving it.'), el];
  });
  if (editor) ctx.main.append(test.el);

  const jumps = section(ctx, 'Possible jumps in the hourly bounce rate', async () => {
    const a = await api.get(base + '/suggestions', 'days=14', signal);
    return [h('p.caption', sentence('Found by ' + a.method)), table('alert-suggestions', [
      ['Since', (s) => at(s.startedAt)],
      ['Bounce rate', (s) => `${fmt.percent(s.expectedRate)} expected, ${fmt.percent(s.observedRate)} seen (`
        + fmt.points(s.changePercentagePoints / 100) + ')'], ['Sessions', (s) => fmt.count(s.sessionsSince)],
      ['', (s) => editor && h('button.link', { text: 'Make a rule', onclick: () => edit({ definition: s.suggestedRule }) })],
    ], a.suggestions, sentence(a.notice ?? 'no jump stands out in the last 14 days'))];
  });
  return Promise.all([notices, rules, rule, jumps]);
}

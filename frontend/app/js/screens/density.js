// Ad density: bounce by ads on the entry page with 95% intervals, the fitted knee in words, the recommended ad cap.

import { h, select } from '../dom.js';
import { heading, showScope, load, emptyMessage } from '../screen.js';
import { COLORS, barsAndLine, axis } from '../charts.js';
import { readFit, densityVerdict, readAdvice, sentence } from '../verdict.js';

export const id = 'density';
export const title = 'Ad density';

const THIN = 100; // sessions below which a point is drawn hollow: its interval is wide

export async function render(ctx) {
  const { fmt, state } = ctx;
  const pct = (v) => fmt.percent(v);
  const ads = ['entryAds', 'Ads on the entry page'];
  const rpm = ['sessionRpm', 'Session RPM', 'money'];
  const scope = heading(ctx, 'Ad density and bounce', 'Where more ads on the first page start to drive readers away, '
    + 'and which ad cap earns most per visit.');
  const verdict = h('section.verdict', null, h('h2', 'What the data say'), 'Loading…');
  const bounce = ctx.panel({
    id: 'bounce', title: 'Bounce rate by ads on the entry page',
    tools: [select('Model', 'model', ['logistic', 'linear'], state.extras.model,
      (e) => ctx.navigate({ extras: { model: e.target.value } }), 'density-model')],
    caption: `With 95% intervals (Wilson); bigger points have more sessions, hollow ones fewer than ${THIN}. Line: the `
      + 'fitted curve; shaded: the knee\'s 95% interval.',
    columns: [ads, ['sessions', 'Sessions', 'count'], ['bounces', 'Bounces', 'count'],
      ['bounceRate', 'Bounce rate', '%'], ['bounceLower', 'Bounce rate, 95% lower', '%'],
      ['bounceUpper', 'Bounce rate, 95% upper', '%'], ['pagesPerSession', 'Pages per session', '.2'], rpm],
  });
  const volume = ctx.panel({ id: 'volume', title: 'Sessions and session RPM by ads on the entry page',
    caption: 'How many sessions stand behind each point, and what they earned.',
    columns: [ads, ['sessions', 'Sessions', 'count'], rpm] });
  const caps = ctx.panel({ id: 'caps', title: 'Session RPM if every page had at most n ads',
    caption: 'Estimates with 95% intervals (bootstrap); grey caps have too little data.',
    columns: [['ads', 'Ad cap'], rpm, ['lower', '95% lower', fmt.money], ['upper', '95% upper', fmt.money],
      ['probabilityBest', 'Probability best', '%0'], ['pages', 'Pageviews', 'count'],
      ['note', 'Note', null, { text: true }]] });
  ctx.main.append(verdict, bounce.el, volume.el, caps.el);

  const loaded = await load(ctx, 'density', { model: state.extras.model }, [bounce, volume, caps]);
  if (!loaded) return verdict.remove();
  const [answer, before] = loaded;
  showScope(ctx, scope, answer.scope, before?.scope);
  const { points, notice } = answer;
  const fit = readFit(answer.fit);
  const advice = readAdvice(answer.recommendation);
  if (!points.length) {
    const msg = emptyMessage('sessions', notice);
    [bounce, volume, caps].forEach((p) => p.empty(msg));
    return verdict.replaceChildren(verdict.firstChild, msg);
  }
  const xs = points.map((p) => p.entryAds);
  const words = drawVerdict(fmt, verdict, notice, fit, advice);
  const most = Math.max(...points.map((p) => p.sessions));
  const datasets = [{
    label: 'Bounce rate (95% interval)', data: points.map((p) => ({ x: p.entryAds, y: p.bounceRate })),
    intervals: points.map((p) => [p.bounceLower, p.bounceUpper]), intervalColor: COLORS.blue,
    pointRadius: points.map((p) => 3 + 8 * Math.sqrt(p.sessions / most)),
    backgroundColor: points.map((p) => (p.sessions < THIN ? COLORS.paper : COLORS.blue + 'bf')),
    borderColor: COLORS.blue, borderWidth: 1.5,
  }];
  const bands = [];
  const lines = [];
  if (fit?.curve) {
    datasets.push({ type: 'line', label: 'Fitted segmented curve', data: fit.curve, borderColor: COLORS.orange,
      borderWidth: 2.5, pointRadius: 0 });
    for (const b of fit.breakpoints) {
      if (b.lower != null) bands.push({ from: b.lower, to: b.upper, color: COLORS.vermillion + '1f' });
      lines.push({ x: b.estimate, color: COLORS.vermillion, label: `knee ≈ ${fmt.decimal(b.estimate, 1)} ads` });
    }
  }
  const cap = advice?.cap;
  if (cap != null) lines.push({ x: cap, color: COLORS.green, dash: [2, 3], label: `recommended cap: ${cap}` });
  if (before?.points.length) {
    datasets.push({ label: `Previous period, ${fmt.range(before.scope.from, before.scope.to)}`, pointStyle: 'rectRot',
      data: before.points.map((p) => ({ x: p.entryAds, y: p.bounceRate })), pointRadius: 5,
      backgroundColor: COLORS.paper, borderColor: COLORS.muted, borderWidth: 1.5 });
  }
  bounce.show(points, { type: 'scatter', data: { datasets }, options: {
    scales: {
      x: { ...axis(ads[1]), min: Math.min(...xs) - 0.5, max: Math.max(...xs) + 0.5,
        afterBuildTicks: (s) => { s.ticks = xs.map((value) => ({ value })); } },
      y: { ...axis('Bounce rate'), ticks: { callback: (v) => fmt.percent(v, 0) }, min: 0,
        suggestedMax: Math.min(1, Math.max(...points.map((p) => p.bounceUpper ?? p.bounceRate)) + 0.03) },
    },
    plugins: {
      flGuides: { bands, lines },
      tooltip: { callbacks: { label: (c) => {
        const p = points[c.dataIndex];
        return c.datasetIndex ? `${c.dataset.label}: ${pct(c.parsed.y)}` : `${p.entryAds} ads: ${pct(p.bounceRate)} `
          + `bounce (95%: ${pct(p.bounceLower)} to ${pct(p.bounceUpper)}), ${fmt.count(p.sessions)} sessions`;
      } } },
    },
  } }, { note: sentence(notice), label: `Bounce rate for ${points.length} ad counts. ${words}` });
  volume.show(points, barsAndLine({
    labels: xs, xTitle: ads[1],
    bar: { label: 'Sessions', data: points.map((p) => p.sessions), color: COLORS.sky + 'cc', format: fmt.count },
    line: { label: 'Session RPM', data: points.map((p) => p.sessionRpm), color: COLORS.blue, format: fmt.money },
  }), { label: `Sessions for each of ${points.length} ad counts` });
  if (!advice?.caps.length) {
    return caps.empty(sentence(notice ? 'no ad cap can be judged: ' + notice : 'the server gave no ad-cap estimates'));
  }
  caps.show(advice.caps, {
    type: 'bar',
    data: { labels: advice.caps.map((c) => c.ads), datasets: [{ label: 'Session RPM',
      data: advice.caps.map((c) => c.sessionRpm), intervals: advice.caps.map((c) => [c.lower, c.upper]),
      backgroundColor: advice.caps.map((c) => (!c.enough ? '#c9cdd0' : c.ads === advice.cap ? COLORS.green
        : COLORS.blue + 'b3')) }] },
    options: { scales: { x: axis('At most this many ads on every page'), y: { ticks: { callback: fmt.money } } },
      plugins: { legend: { display: false } } },
  }, { label: `Estimated session RPM for ${advice.caps.length} ad caps` });
}

function drawVerdict(fmt, section, notice, fit, advice) {
  const words = densityVerdict(fit, fmt);
  const signed = (v) => (v < 0 ? '−' : '+') + fmt.money(Math.abs(v));
  const g = advice?.gain;
  const facts = [advice?.probability != null && fmt.percent(advice.probability, 0) + ' probability that it is best',
    g?.estimate != null && `expected gain ${signed(g.estimate)} per 1,000 sessions`
      + (g.lower != null ? ` (95% interval ${signed(g.lower)} to ${signed(g.upper)})` : '')].filter(Boolean);
  section.replaceChildren(section.firstChild, h('p.verdict-text#verdict', words),
    fit?.model ? h('p.quiet#model', [`Model: ${fit.model}.`, sentence(fit.reason),
      fit.slopes.length && `Slopes: ${fit.slopes.map((s) => fmt.decimal(s.estimate, 3)).join(' then ')}`
        + (fit.slopes[0].unit ? ` (${fit.slopes[0].unit}).` : '.'),
      fit.pValue !== null && `Break test${fit.test ? ` (${fit.test})` : ''}: ${fmt.pValue(fit.pValue)}.`,
    ].filter(Boolean).join(' ')) : '',
    h('div.recommendation#recommendation', null, h('h3', 'Recommended ad cap'),
      h('p.cap', advice?.cap != null ? `At most ${advice.cap} ads per page` : 'No cap can be recommended yet'),
      advice?.cap != null && facts.length > 0 && h('p#cap-facts', sentence(facts.join('; '))),
      [advice?.summary, advice?.pairSummary].filter(Boolean).map((s) => h('p', sentence(s))),
      !advice && h('p.quiet', sentence(notice ? 'no recommendation: ' + notice
        : 'the server gave no ad-cap recommendation')),
      advice?.caution && h('p.caution', advice.caution)));
  return words;
}

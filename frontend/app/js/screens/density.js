// Ad density: bounce rate by ads on the entry page with 95% intervals, the fitted segmented curve, the knee with its
// interval, the verdict in words, and the recommended ad cap.

import { h, select } from '../dom.js';
import { heading, showScope, load, emptyMessage } from '../screen.js';
import { COLORS, alpha, barsAndLine } from '../charts.js';
import { readFit, densityVerdict, readAdvice, sentence } from '../verdict.js';

export const id = 'density';
export const title = 'Ad density';

const THIN = 100; // sessions below which a point is drawn hollow: its interval is wide

export async function render(ctx) {
  const { fmt, state } = ctx;
  const pct = (v) => fmt.percent(v);
  const scope = heading(ctx, 'Ad density and bounce', 'Where more ads on the first page a reader sees start to '
    + 'drive readers away, and which ad cap earns the most per visit.');
  const verdict = h('section', { class: 'verdict', 'aria-labelledby': 'verdict-title' },
    h('h2', { id: 'verdict-title', text: 'What the data say' }), h('p', { class: 'quiet', text: 'Loading…' }));
  const model = select('Model', 'model', ['logistic', 'linear'], state.extras.model,
    (e) => ctx.navigate({ extras: { model: e.target.value } }), 'density-model');
  const bounce = ctx.panel({
    id: 'bounce', title: 'Bounce rate by ads on the entry page', tools: [model],
    caption: 'Points: bounce rate of sessions whose first page carried that many ads, with 95% intervals (Wilson); '
      + `bigger points have more sessions, hollow ones fewer than ${THIN}. Line: the fitted segmented curve. Shaded: `
      + 'the knee with its 95% interval.',
    columns: [
      { key: 'entryAds', label: 'Ads on the entry page' },
      { key: 'sessions', label: 'Sessions', format: fmt.count },
      { key: 'bounces', label: 'Bounces', format: fmt.count },
      { key: 'bounceRate', label: 'Bounce rate', format: pct },
      { key: 'bounceLower', label: 'Bounce rate, 95% lower', format: pct },
      { key: 'bounceUpper', label: 'Bounce rate, 95% upper', format: pct },
      { key: 'pagesPerSession', label: 'Pages per session', format: (v) => fmt.decimal(v, 2) },
      { key: 'sessionRpm', label: `Session RPM (${fmt.currency})`, format: fmt.money },
    ],
  });
  const volume = ctx.panel({
    id: 'volume', title: 'Sessions and session RPM by ads on the entry page',
    caption: 'How many sessions stand behind each point, and what those visits earned per 1,000 sessions.',
    columns: [
      { key: 'entryAds', label: 'Ads on the entry page' },
      { key: 'sessions', label: 'Sessions', format: fmt.count },
      { key: 'sessionRpm', label: `Session RPM (${fmt.currency})`, format: fmt.money },
    ],
  });
  const caps = ctx.panel({
    id: 'caps', title: 'Session RPM if every page had at most n ads',
    caption: 'The estimate for each cap with its 95% interval (bootstrap); grey caps have too little data to judge.',
    columns: [
      { key: 'ads', label: 'Ad cap' },
      { key: 'sessionRpm', label: `Session RPM (${fmt.currency})`, format: fmt.money },
      { key: 'lower', label: '95% lower', format: fmt.money },
      { key: 'upper', label: '95% upper', format: fmt.money },
      { key: 'probabilityBest', label: 'Probability best', format: (v) => fmt.percent(v, 0) },
      { key: 'pages', label: 'Pageviews', format: fmt.count },
      { key: 'note', label: 'Note', text: true },
    ],
  });
  ctx.main.append(verdict, bounce.el, volume.el, caps.el);

  const loaded = await load(ctx, 'density', { model: state.extras.model }, [bounce, volume, caps]);
  if (!loaded) return verdict.replaceChildren();
  const [answer, before] = loaded;
  showScope(ctx, scope, answer.scope, before?.scope);
  const points = answer.points;
  const fit = readFit(answer.fit);
  const sessions = points.reduce((n, p) => n + p.sessions, 0);
  const advice = readAdvice(answer.recommendation);
  if (!points.length) {
    const msg = emptyMessage('sessions', answer.notice);
    for (const p of [bounce, volume, caps]) p.empty(msg);
    return verdict.replaceChildren(h('h2', { id: 'verdict-title', text: 'What the data say' }), h('p', { text: msg }));
  }
  const xs = points.map((p) => p.entryAds);
  const xMin = Math.min(...xs);
  const xMax = Math.max(...xs);
  drawVerdict(ctx, verdict, answer, fit, advice);

  const maxSessions = Math.max(...points.map((p) => p.sessions));
  const radius = (p) => 3 + 8 * Math.sqrt(p.sessions / maxSessions);
  const datasets = [{
    label: 'Bounce rate (95% interval)', data: points.map((p) => ({ x: p.entryAds, y: p.bounceRate })),
    intervals: points.map((p) => ({ lower: p.bounceLower, upper: p.bounceUpper })), intervalColor: COLORS.blue,
    pointRadius: points.map(radius),
    backgroundColor: points.map((p) => (p.sessions < THIN ? COLORS.paper : alpha(COLORS.blue, 0.75))),
    borderColor: COLORS.blue, borderWidth: 1.5,
  }];
  const bands = [];
  const lines = [];
  if (fit?.curve) {
    datasets.push({ type: 'line', label: 'Fitted segmented curve', data: fit.curve, borderColor: COLORS.orange,
      borderWidth: 2.5, pointRadius: 0 });
    for (const b of fit.breakpoints) {
      if (b.lower !== null && b.upper !== null) bands.push({ from: b.lower, to: b.upper, color: alpha(COLORS.vermillion, 0.12) });
      lines.push({ x: b.estimate, color: COLORS.vermillion, label: `knee ≈ ${fmt.decimal(b.estimate, 1)} ads` });
    }
  }
  if (advice?.cap !== null && advice?.cap !== undefined) {
    lines.push({ x: advice.cap, color: COLORS.green, dash: [2, 3], label: `recommended cap: ${advice.cap}` });
  }
  if (before?.points?.length) {
    datasets.push({ label: `Previous period, ${fmt.range(before.scope.from, before.scope.to)}`, pointStyle: 'rectRot',
      data: before.points.map((p) => ({ x: p.entryAds, y: p.bounceRate })), pointRadius: 5,
      backgroundColor: COLORS.paper, borderColor: COLORS.muted, borderWidth: 1.5 });
  }
  const top = Math.max(...points.map((p) => p.bounceUpper ?? p.bounceRate ?? 0));
  const integers = (scale) => { scale.ticks = xs.map((value) => ({ value })); };
  bounce.show(points, {
    type: 'scatter',
    data: { datasets },
    options: {
      scales: {
        x: { type: 'linear', min: xMin - 0.5, max: xMax + 0.5, title: { display: true, text: 'Ads on the entry page' },
          afterBuildTicks: integers },
        y: { title: { display: true, text: 'Bounce rate' }, ticks: { callback: (v) => fmt.percent(v, 0) },
          min: 0, suggestedMax: Math.min(1, top + 0.03) },
      },
      plugins: {
        flGuides: { bands, lines },
        tooltip: { callbacks: { label: (c) => {
          if (c.datasetIndex !== 0) return `${c.dataset.label}: ${pct(c.parsed.y)}`;
          const p = points[c.dataIndex];
          return `${p.entryAds} ads: ${pct(p.bounceRate)} bounce (95%: ${pct(p.bounceLower)} to ${pct(p.bounceUpper)}), `
            + `${fmt.count(p.sessions)} sessions`;
        } } },
      },
    },
  }, { note: answer.notice ? sentence(answer.notice) : '', label: `Bounce rate for ${points.length} ad counts. ${verdict.dataset.words}` });
  volume.show(points, barsAndLine({
    labels: xs.map(String), xTitle: 'Ads on the entry page',
    bar: { label: 'Sessions', data: points.map((p) => p.sessions), color: alpha(COLORS.sky, 0.8), format: fmt.count },
    line: { label: 'Session RPM', data: points.map((p) => p.sessionRpm), color: COLORS.blue, format: fmt.money },
  }), { label: `Sessions for each of ${points.length} ad counts` });

  if (!advice?.caps.length) {
    caps.empty(answer.notice ? sentence('no ad cap can be judged: ' + answer.notice)
      : 'The server gave no ad-cap estimates for this segment.');
    return;
  }
  caps.show(advice.caps, {
    type: 'bar',
    data: { labels: advice.caps.map((c) => String(c.ads)), datasets: [{ label: 'Session RPM',
      data: advice.caps.map((c) => c.sessionRpm),
      backgroundColor: advice.caps.map((c) => (!c.enough ? '#c9cdd0' : c.ads === advice.cap ? COLORS.green
        : alpha(COLORS.blue, 0.7))),
      intervals: advice.caps.map((c) => ({ lower: c.lower, upper: c.upper })) }] },
    options: {
      scales: { x: { title: { display: true, text: 'At most this many ads on every page' } },
        y: { ticks: { callback: (v) => fmt.money(v) } } },
      plugins: { legend: { display: false } },
    },
  }, { label: `Estimated session RPM for ${advice.caps.length} ad caps` });
}

function drawVerdict(ctx, section, answer, fit, advice) {
  const { fmt } = ctx;
  const words = densityVerdict(fit, fmt);
  section.dataset.words = words;
  const parts = [h('h2', { id: 'verdict-title', text: 'What the data say' }),
    h('p', { class: 'verdict-text', id: 'verdict', text: words })];
  if (fit?.model) {
    const k = fit.breakpoints[0];
    parts.push(h('p', { class: 'quiet', id: 'model', text: [
      `Model: ${fit.model}.`, fit.reason ? sentence(fit.reason) : '',
      k ? `Knee at ${fmt.decimal(k.estimate, 1)} ads` + (k.lower !== null ? ` (95% interval ${fmt.decimal(k.lower, 1)} to ${fmt.decimal(k.upper, 1)}).` : '.') : '',
      fit.slopes.length ? 'Slopes: ' + fit.slopes.map((s) => fmt.decimal(s.estimate, 3)).join(' then ')
        + (fit.slopes[0].unit ? ` (${fit.slopes[0].unit}).` : '.') : '',
      fit.pValue !== null ? `Break test${fit.test ? ' (' + fit.test + ')' : ''}: ${fmt.pValue(fit.pValue)}.` : '',
    ].filter(Boolean).join(' ') }));
  }
  const box = h('div', { class: 'recommendation', id: 'recommendation' }, h('h3', { text: 'Recommended ad cap' }));
  if (advice?.cap !== null && advice?.cap !== undefined) {
    box.append(h('p', { class: 'cap', text: `At most ${advice.cap} ads per page` }));
    const facts = [];
    if (advice.probability !== null) facts.push(`${fmt.percent(advice.probability, 0)} probability that it is the best cap`);
    const g = advice.gain;
    const signed = (v) => (v < 0 ? '−' : '+') + fmt.money(Math.abs(v));
    if (g.estimate !== null) {
      facts.push(`expected gain ${signed(g.estimate)} per 1,000 sessions`
        + (g.lower !== null && g.upper !== null ? ` (95% interval ${signed(g.lower)} to ${signed(g.upper)})` : ''));
    }
    if (facts.length) box.append(h('p', { id: 'cap-facts', text: sentence(facts.join('; ')) }));
  } else {
    box.append(h('p', { class: 'cap', text: 'No cap can be recommended yet' }));
  }
  if (advice?.summary) box.append(h('p', { text: sentence(advice.summary) }));
  if (advice?.pair?.summary) box.append(h('p', { text: sentence(advice.pair.summary) }));
  if (!advice) box.append(h('p', { class: 'quiet', text: answer.notice ? sentence('no recommendation: ' + answer.notice)
    : 'The server gave no ad-cap recommendation for this segment.' }));
  if (advice?.caution) box.append(h('p', { class: 'caution', text: advice.caution }));
  parts.push(box);
  section.replaceChildren(...parts);
}

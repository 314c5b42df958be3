// Ad density: bounce rate by ads on the entry page with 95% intervals, the fitted segmented line, the knee and the
// recommended ad cap.

import { h } from '../dom.js';
import { heading, showScope, metrics, previous, emptyMessage } from '../screen.js';
import { COLORS, alpha } from '../charts.js';
import { readFit, densityVerdict, readRecommendation } from '../verdict.js';

export const id = 'density';
export const title = 'Ad density';

const THIN = 100; // sessions below which a point is drawn hollow: its interval is wide

export async function render(ctx) {
  const { fmt } = ctx;
  const scope = heading(ctx, 'Ad density and bounce', 'Where more ads on the first page a reader sees start to '
    + 'drive readers away, and which cap earns the most per visit.');
  const verdict = h('section', { class: 'verdict', 'aria-live': 'polite', 'aria-labelledby': 'verdict-title' },
    h('h2', { id: 'verdict-title', text: 'What the data say' }), h('p', { class: 'quiet', text: 'Loading…' }));
  const pct = (v) => fmt.percent(v);
  const bounce = ctx.panel({
    id: 'bounce', title: 'Bounce rate by ads on the entry page',
    caption: 'Each point is the bounce rate of sessions whose first page carried that many ads, with its 95% interval '
      + '(Wilson). Bigger points have more sessions; hollow points have fewer than ' + THIN + '. The shaded band is '
      + 'the knee with its interval.',
    columns: [
      { key: 'entryAds', label: 'Ads on the entry page', num: true },
      { key: 'sessions', label: 'Sessions', num: true, format: fmt.count },
      { key: 'bounces', label: 'Bounces', num: true, format: fmt.count },
      { key: 'bounceRate', label: 'Bounce rate', num: true, format: pct },
      { key: 'bounceLower', label: 'Bounce rate, 95% lower', num: true, format: pct },
      { key: 'bounceUpper', label: 'Bounce rate, 95% upper', num: true, format: pct },
      { key: 'pagesPerSession', label: 'Pages per session', num: true, format: (v) => fmt.decimal(v, 2) },
      { key: 'sessionRpm', label: `Session RPM (${fmt.currency})`, num: true, format: fmt.money },
    ],
  });
  const volume = ctx.panel({
    id: 'volume', title: 'Sessions and session RPM by ads on the entry page',
    caption: 'How many sessions stand behind each point, and what a visit earned per 1,000 sessions.',
    columns: [
      { key: 'entryAds', label: 'Ads on the entry page', num: true },
      { key: 'sessions', label: 'Sessions', num: true, format: fmt.count },
      { key: 'sessionRpm', label: `Session RPM (${fmt.currency})`, num: true, format: fmt.money },
    ],
  });
  ctx.main.append(verdict, bounce.el, volume.el);

  const [answer, before] = await Promise.all([metrics(ctx, 'density'), previous(ctx, 'density')
  ]).catch((e) => {
    if (e.name === 'AbortError') throw e;
    bounce.error(e);
    volume.error(e);
    verdict.replaceChildren(h('h2', { id: 'verdict-title', text: 'What the data say' }),
      h('p', { class: 'error', text: 'No answer from the server.' }));
    return [];
  });
  if (!answer) return;
  showScope(ctx, scope, answer.scope, before?.scope);
  const points = answer.points;
  if (!points.length) {
    const msg = emptyMessage('sessions', answer.notice);
    bounce.empty(msg);
    volume.empty(msg);
    verdict.replaceChildren(h('h2', { id: 'verdict-title', text: 'What the data say' }), h('p', { text: msg }));
    return;
  }
  const xs = points.map((p) => p.entryAds);
  const xMin = Math.min(...xs);
  const xMax = Math.max(...xs);
  const fit = readFit(answer.fit);
  const rec = readRecommendation(answer.recommendation);
  drawVerdict(ctx, verdict, answer, fit, rec, xMin, xMax);
  const note = answer.notice ? emptyMessage('', answer.notice).replace('Widen', 'The knee needs more data: widen') : '';

  const maxSessions = Math.max(...points.map((p) => p.sessions));
  const datasets = [{
    type: 'scatter', label: 'Bounce rate (95% interval)', data: points.map((p) => ({ x: p.entryAds, y: p.bounceRate })),
    intervals: points.map((p) => ({ lower: p.bounceLower, upper: p.bounceUpper })), intervalColor: COLORS.blue,
    pointRadius: points.map((p) => 3 + 8 * Math.sqrt(p.sessions / maxSessions)),
    pointHoverRadius: points.map((p) => 4 + 8 * Math.sqrt(p.sessions / maxSessions)),
    backgroundColor: points.map((p) => (p.sessions < THIN ? COLORS.paper : alpha(COLORS.blue, 0.75))),
    borderColor: COLORS.blue, borderWidth: 1.5,
  }];
  const bands = [];
  const lines = [];
  if (fit?.predict) {
    const curve = [];
    for (let x = xMin; x <= xMax + 1e-9; x += 0.25) curve.push({ x, y: fit.predict(x) });
    datasets.push({ type: 'line', label: 'Fitted segmented line', data: curve, borderColor: COLORS.orange,
      borderWidth: 2.5, pointRadius: 0, tension: 0 });
    for (const b of fit.breakpoints) {
      if (b.lower !== null && b.upper !== null) bands.push({ from: b.lower, to: b.upper, color: alpha(COLORS.vermillion, 0.12) });
      lines.push({ x: b.estimate, color: COLORS.vermillion, label: `knee ≈ ${fmt.decimal(b.estimate, 1)} ads` });
    }
  }
  if (rec?.cap !== null && rec?.cap !== undefined) {
    lines.push({ x: rec.cap, color: COLORS.green, dash: [2, 3], label: `recommended cap: ${rec.cap}` });
  }
  if (before?.points?.length) {
    datasets.push({ type: 'scatter', label: `Previous period, ${fmt.range(before.scope.from, before.scope.to)}`,
      data: before.points.map((p) => ({ x: p.entryAds, y: p.bounceRate })), pointStyle: 'rectRot', pointRadius: 5,
      backgroundColor: COLORS.paper, borderColor: COLORS.muted, borderWidth: 1.5 });
  }
  const byAds = new Map(points.map((p) => [p.entryAds, p]));
  bounce.show(points, {
    type: 'scatter',
    data: { datasets },
    options: {
      scales: {
        x: { type: 'linear', min: xMin - 0.5, max: xMax + 0.5, title: { display: true, text: 'Ads on the entry page' },
          ticks: { stepSize: 1, callback: (v) => (Number.isInteger(v) ? v : '') } },
        y: { title: { display: true, text: 'Bounce rate' }, ticks: { callback: (v) => fmt.percent(v, 0) },
          suggestedMin: 0 },
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
  }, { note, label: `Bounce rate for ${points.length} ad counts from ${xMin} to ${xMax}. ${verdict.dataset.text ?? ''}` });
  volume.show(points, {
    data: {
      labels: xs.map(String),
      datasets: [
        { type: 'bar', label: 'Sessions', data: points.map((p) => p.sessions), backgroundColor: alpha(COLORS.sky, 0.8),
          yAxisID: 'y' },
        { type: 'line', label: 'Session RPM', data: points.map((p) => p.sessionRpm), borderColor: COLORS.blue,
          pointRadius: 3, yAxisID: 'y1' },
      ],
    },
    options: {
      scales: {
        x: { title: { display: true, text: 'Ads on the entry page' } },
        y: { title: { display: true, text: 'Sessions' }, ticks: { callback: (v) => fmt.count(v) } },
        y1: { position: 'right', grid: { drawOnChartArea: false }, title: { display: true, text: 'Session RPM' },
          ticks: { callback: (v) => fmt.money(v) } },
      },
      plugins: { tooltip: { callbacks: { label: (c) => (c.datasetIndex === 0 ? `${fmt.count(c.parsed.y)} sessions`
        : `Session RPM ${fmt.money(byAds.get(Number(c.label))?.sessionRpm)}`) } } },
    },
  }, { label: `Sessions for each of ${points.length} ad counts` });
}

function drawVerdict(ctx, section, answer, fit, rec, xMin, xMax) {
  const { fmt } = ctx;
  const words = densityVerdict(fit, fmt, xMin, xMax);
  section.dataset.text = words;
  const parts = [h('h2', { id: 'verdict-title', text: 'What the data say' }), h('p', { class: 'verdict-text', id: 'verdict', text: words })];
  if (fit?.model) {
    parts.push(h('p', { class: 'quiet', id: 'model', text: `Model: ${fit.model}${fit.reason ? ' — ' + fit.reason : ''}.`
      + (fit.pValue !== null && fit.pValue !== undefined ? ` Break test (Davies): ${fmt.pValue(fit.pValue)}.` : '') }));
  }
  if (rec) {
    const cap = rec.label ?? (rec.cap !== null ? `${rec.cap} ads per page` : null);
    const box = h('div', { class: 'recommendation', id: 'recommendation' },
      h('h3', { text: 'Recommended ad cap' }),
      h('p', { class: 'cap', text: cap ?? 'No cap can be recommended yet.' }));
    const facts = [];
    if (rec.probability !== null) facts.push(`${fmt.percent(rec.probability, 0)} probability that it is the best cap`);
    if (rec.gain?.estimate !== null && rec.gain?.estimate !== undefined) {
      const sign = (v) => (v < 0 ? '−' : '+') + fmt.money(Math.abs(v));
      facts.push(`expected gain ${sign(rec.gain.estimate)} per 1,000 sessions`
        + (rec.gain.lower !== null && rec.gain.upper !== null ? ` (95% interval ${sign(rec.gain.lower)} to ${sign(rec.gain.upper)})` : ''));
    }
    if (facts.length) box.append(h('p', { text: facts.join('; ') + '.' }));
    if (rec.summary) box.append(h('p', { text: rec.summary }));
    if (rec.caution) box.append(h('p', { class: 'caution', text: rec.caution }));
    parts.push(box);
  } else {
    parts.push(h('p', { class: 'quiet', text: answer.notice ? 'No ad cap is recommended: ' + answer.notice + '.'
      : 'The server gave no ad-cap recommendation for this answer.' }));
  }
  section.replaceChildren(...parts);
}

// Fit your own curve: pasted columns sent to the fits API (segmented regression or Kneedle), the answer in words
// and tables, and the points with the fitted curve.

import { h, field, select } from '../dom.js';
import { heading } from '../screen.js';
import { form, table } from '../manage.js';
import { parseColumns } from '../columns.js';
import { COLORS, axis } from '../charts.js';
import { sentence } from '../verdict.js';

export const id = 'fit';
export const title = 'Fit a curve';

export function render(ctx) {
  const { fmt } = ctx;
  const n = (v) => fmt.sig(v);
  const iv = (lo, hi) => (lo == null ? '–' : `${n(lo)} to ${n(hi)}`);
  heading(ctx, 'Fit your own curve', 'Paste x and y columns (from a spreadsheet or CSV, header optional) and maybe '
    + 'a third: weights, or trials when y counts successes. Segmented regression finds where the slope changes, '
    + 'Kneedle the knee of a saturating curve.');
  const result = h('section.verdict#fit-result', { hidden: true });
  const chart = ctx.panel({ id: 'fit', title: 'Points and fitted curve',
    columns: [['x', 'x'], ['y', 'y'], ['w', 'Third']] });
  chart.el.hidden = true;
  const data = h('textarea#fit-data', { rows: 10, spellcheck: 'false', placeholder: 'ads\tbounce rate\n0\t0.31\n…' });
  const method = select('Method', 'method', [{ value: 'segmented', label: 'Segmented regression' },
    { value: 'trials', label: 'Segmented, y successes of trials' }, { value: 'knee', label: 'Knee (Kneedle)' }], 0,
  null, 'fit-method');
  const input = form('fit-form', 'Fit', [['maxBreakpoints', 'Breakpoints at most', 'number', 2, { min: 0, max: 3 }],
    ['sensitivity', 'Kneedle sensitivity', 'number', 1, { min: 0, step: 'any' }]], (v) => {
    const { names, columns: [x, y, w] } = parseColumns(data.value);
    const m = method.lastChild.value;
    const kind = m === 'knee' ? m : 'segmented';
    return ctx.api.post('/api/v1/fits/' + kind, { x, y, [m === 'trials' ? m : 'weights']: w, ...v })
      .then((answer) => show(answer, kind, names, x.map((x, i) => ({ x, y: y[i], w: w?.[i] })), m === 'trials'));
  }, () => {});
  input.prepend(field('Data (a third column: weights, or trials)', data, ' wide'), method);
  ctx.main.append(input, result, chart.el);

  function show(answer, kind, names, points, trials) {
    const fit = kind === 'knee' ? answer.segmented : answer;
    const k = answer.kneedle;
    const lines = k?.found ? [{ x: k.knee, color: COLORS.green, label: `Kneedle knee ${n(k.knee)}` }] : [];
    const test = fit.breakTest;
    result.replaceChildren(h('div', null, h('h2', k ? 'Knee' : 'Segmented fit'),
      k && [h('p.verdict-text#kneedle', k.found ? `Kneedle: knee at x = ${n(k.knee)} (${k.curve} ${k.direction})`
        : sentence('Kneedle: ' + k.reason)),
      h('h3', 'Second opinion: segmented fit')],
      fit.notice ? sentence(fit.notice) : [
        h('p', { class: k ? '' : 'verdict-text', text: sentence(fit.verdict) }),
        h('p.quiet', `${sentence(fit.model)} ${sentence(fit.reason)} ${test.method} test of any `
          + `break: ${fmt.pValue(test.pValue)}. Residual (${fit.residualKind}): ${n(fit.residual)}.`),
        h('h3', 'Breakpoints'),
        table('fit-breakpoints', [['Breakpoint', (b) => n(b.estimate)], ['Standard error', (b) => n(b.standardError)],
          ['95% interval', (b) => iv(b.lower, b.upper)],
          ['Bootstrap 95%', (b) => iv(b.bootstrapLower, b.bootstrapUpper)]],
        fit.breakpoints, 'None: a straight line fits best.'),
        h('h3', 'Slopes'),
        table('fit-slopes', [['Segment', (_s, i) => i + 1], ['Slope', (s) => n(s.estimate)],
          ['Standard error', (s) => n(s.standardError)], ['95% interval', (s) => iv(s.lower, s.upper)],
          ['Unit', (s) => s.unit]],
        fit.slopes)]));
    for (const b of fit.breakpoints ?? []) {
      lines.push({ x: b.estimate, color: COLORS.vermillion, label: `break ${n(b.estimate)}` });
    }
    result.hidden = chart.el.hidden = false;
    // with trials y counts successes: the chart shows the proportion, which the binomial model fits
    chart.show(points, { type: 'scatter', data: { datasets: [
      { label: 'Points', data: points.map((p) => ({ x: p.x, y: trials && p.w ? p.y / p.w : p.y })),
        backgroundColor: COLORS.blue + 'b3', pointRadius: 4 },
      { type: 'line', label: 'Fitted curve', data: fit.curve, borderColor: COLORS.orange, borderWidth: 2.5,
        pointRadius: 0 }] },
    options: { scales: { x: axis(names[0]), y: axis(names[1]) }, plugins: { flGuides: { lines } } } },
    { label: `${points.length} points and the fitted curve` });
  }
}

import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFit, densityVerdict, kneeOf, readAdvice, num } from '../verdict.js';
import { makeFormat } from '../format.js';

const fmt = makeFormat('en-US', 'EUR');

// a FitSummary as the density answer carries it: flat at 0.30 up to 5 ads, then +0.07 per ad
const curve = [];
for (let x = 0; x <= 10; x += 0.5) curve.push({ x, y: 0.3 + Math.max(0, x - 5) * 0.07 });
const summary = {
  model: 'segmented linear regression, weighted (Muggeo 2003)', breakpointCount: 1,
  reason: 'BIC: 1 breakpoint (BIC -41.2) beats 0 (-20.3)',
  breakpoints: [{ estimate: 5.0, standardError: 0.3, lower: 4.4, upper: 5.6 }],
  slopes: [{ estimate: 0, lower: -0.008, upper: 0.008, unit: 'bounce rate per ad' }, { estimate: 0.07, unit: 'bounce rate per ad' }],
  breakTest: { method: 'Davies (2002)', pValue: 0.0004, breakFound: true },
  curve,
};

test('the fit is read in one shape', () => {
  const fit = readFit(summary);
  assert.equal(fit.breakFound, true);
  assert.equal(fit.pValue, 0.0004);
  assert.equal(fit.curve.length, 21);
  assert.deepEqual([fit.breakpoints[0].estimate, fit.breakpoints[0].lower, fit.breakpoints[0].upper], [5, 4.4, 5.6]);
  assert.equal(fit.slopes[1].unit, 'bounce rate per ad');
});

test("the server's verdict is said with the break test's p-value", () => {
  const fit = readFit({ ...summary, verdict: 'bounce stays about flat up to 5.0 ads (95% interval 4.4 to 5.6), then rises about 7.0 points per extra ad' });
  assert.equal(densityVerdict(fit, fmt), 'Bounce stays about flat up to 5.0 ads (95% interval 4.4 to 5.6), '
    + 'then rises about 7.0 points per extra ad (break test p < 0.001).');
  assert.equal(densityVerdict(readFit({ ...summary, verdict: 'no clear knee: the break test finds no change of slope (p = 0.41)' }), fmt),
    'No clear knee: the break test finds no change of slope (p = 0.41).');
});

test('without words from the server the knee is still named', () => {
  assert.equal(densityVerdict(readFit(summary), fmt), 'The slope changes at 5.0 ads (break test p < 0.001).');
  assert.equal(densityVerdict(readFit({ ...summary, breakTest: { pValue: 0.41, breakFound: false } }), fmt),
    'No clear knee (break test p = 0.41).');
});

test('thin data: the notice is passed on; no fit at all is said plainly', () => {
  assert.equal(densityVerdict(readFit({ notice: 'not enough data for a knee: 2 ad counts' }), fmt),
    'Not enough data for a knee: 2 ad counts.');
  assert.equal(densityVerdict(readFit({ notice: 'the fit did not converge' }), fmt), 'No knee: the fit did not converge.');
  assert.equal(readFit(null), null);
  assert.equal(densityVerdict(null, fmt), 'The server has not estimated a knee for this answer.');
});

test("a saturating curve's knee: Kneedle first, the segmented break second, else the reason", () => {
  const words = (x) => `after about ${x} pages`;
  assert.equal(kneeOf({ kneedle: { found: true, knee: 4 }, segmented: summary }, null, words).text,
    'Knee (Kneedle): after about 4 pages.');
  assert.equal(kneeOf({ kneedle: { found: false, reason: 'flat' }, segmented: summary }, null, words).x, 5);
  assert.equal(kneeOf({ kneedle: { found: false, reason: 'the curve is flat' }, segmented: { notice: 'no fit' } }, null, words).text,
    'No knee: the curve is flat.');
  assert.equal(kneeOf({ kneedle: { found: false, reason: 'no knee: never below the threshold' } }, null, words).text,
    'No knee: never below the threshold.');
  assert.equal(kneeOf(undefined, 'fewer than 200 sessions in this segment (40)', words).text,
    'No knee: fewer than 200 sessions in this segment (40).');
});

test('the ad-cap advice in currency units (the API sends micro-units)', () => {
  const a = readAdvice({
    cap: 5, probabilityBest: 0.71, currentSessionRpmMicros: 15_630_000, expectedGainMicros: 420_000,
    expectedGainLower: -100_000, expectedGainUpper: 900_000, summary: 'Cap at 5 ads.', caution: 'Observational data.',
    entryCap: 4, laterCap: 6, pairProbabilityBest: 0.4,
    caps: [{ ads: 5, status: 'enough_data', sessionRpmMicros: 16_050_000, lower: 15_000_000, upper: 17_000_000, probabilityBest: 0.71 },
      { ads: 9, status: 'not_enough_data', note: 'only 120 pages', probabilityBest: 0 }],
  });
  assert.equal(a.cap, 5);
  assert.equal(a.probability, 0.71);
  assert.deepEqual(a.gain, { estimate: 0.42, lower: -0.1, upper: 0.9 });
  assert.equal(a.summary, 'Cap at 5 ads.');
  assert.deepEqual(a.caps.map((c) => [c.ads, c.enough, c.sessionRpm]), [[5, true, 16.05], [9, false, null]]);
  assert.equal(readAdvice(undefined), null);
  assert.equal(readAdvice({ summary: 'Not enough data.' }).cap, null);
  assert.equal(num('NaN'), null);
});

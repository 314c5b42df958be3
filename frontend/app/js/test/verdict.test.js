import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFit, densityVerdict, readRecommendation, num } from '../verdict.js';
import { makeFormat } from '../format.js';

const fmt = makeFormat('en-US', 'EUR');

// a SegmentedFit as Jackson writes it: flat at 0.30 up to 5 ads, then +0.07 per ad
const linear = {
  breakpointCount: 1, selectionReason: 'BIC prefers 1 breakpoint over 0 and 2', intercept: 0.3,
  breakpoints: [{ estimate: 5.0, slopeChange: 0.07, standardError: 0.3, lower: 4.4, upper: 5.6,
    bootstrapLower: 'NaN', bootstrapUpper: 'NaN' }],
  slopes: [{ estimate: 0.0, standardError: 0.004, lower: -0.008, upper: 0.008 },
    { estimate: 0.07, standardError: 0.01, lower: 0.05, upper: 0.09 }],
  davies: { pValue: 0.0004, statistic: 5.1 },
};

test('a significant knee after a flat stretch is said in words', () => {
  const fit = readFit(linear);
  assert.equal(fit.predict(3), 0.3);
  assert.ok(Math.abs(fit.predict(7) - 0.44) < 1e-12);
  assert.equal(densityVerdict(fit, fmt, 0, 10),
    'Bounce stays flat up to 5 ads, then rises about 7 points per extra ad (break test p < 0.001; knee between 4.4 and 5.6 ads).');
});

test('a knee whose first segment already rises says so', () => {
  const fit = readFit({ ...linear, slopes: [{ estimate: 0.012, lower: 0.004, upper: 0.02 }, linear.slopes[1]] });
  assert.match(densityVerdict(fit, fmt, 0, 10), /^Bounce rises about 1.2 points per extra ad up to 5 ads, then rises about 7 points/);
});

test('no knee when the break test does not reject', () => {
  const fit = readFit({ ...linear, davies: { pValue: 0.41 } });
  assert.equal(densityVerdict(fit, fmt, 0, 10),
    'No clear knee: bounce rises about 4 points per extra ad across 0 to 10 ads (break test p = 0.41).');
});

test('a wrapped logistic fit uses the fitted probabilities', () => {
  const fit = readFit({ model: 'logistic', reason: 'bounce is a proportion', fit: {
    intercept: -1, deviance: 12, breakpoints: [{ estimate: 4, slopeChange: 0.5, lower: 3, upper: 5 }],
    slopes: [{ estimate: 0 }, { estimate: 0.5 }], davies: { pValue: 0.01 } } });
  assert.equal(fit.logistic, true);
  assert.equal(fit.reason, 'bounce is a proportion');
  assert.ok(Math.abs(fit.predict(0) - 1 / (1 + Math.E)) < 1e-12);
  assert.match(densityVerdict(fit, fmt, 0, 8), /^Bounce stays flat up to 4 ads, then rises about \d+ points per extra ad/);
});

test('no fit: the server reason is passed on; absence is said plainly', () => {
  assert.equal(densityVerdict(readFit({ reason: 'TOO_FEW_DISTINCT_X', message: 'only 3 distinct ads-per-page values' }), fmt, 0, 2),
    'No knee could be estimated: only 3 distinct ads-per-page values.');
  assert.equal(readFit(null), null);
  assert.equal(densityVerdict(null, fmt, 0, 1), 'The server has not estimated a knee for this answer.');
});

test('the recommendation: cap, probability of being best, expected gain and caution', () => {
  const r = readRecommendation({
    recommendedCap: 5, summary: 'Cap at 5 ads.', caution: 'Observational data.',
    caps: [{ adCount: 4, probabilityBest: 0.2 }, { adCount: 5, probabilityBest: 0.71 }],
    expectedGainRpm: { estimate: 0.42, lower: -0.1, upper: 0.9 }, currentSessionRpm: 3.1,
  });
  assert.deepEqual(r, { cap: 5, label: null, probability: 0.71, gain: { estimate: 0.42, lower: -0.1, upper: 0.9 },
    current: 3.1, summary: 'Cap at 5 ads.', caution: 'Observational data.' });
  assert.equal(readRecommendation(undefined), null);
  assert.equal(readRecommendation({ recommendedCap: null, summary: 'Not enough data.' }).cap, null);
  assert.equal(num('NaN'), null);
  assert.equal(num('0.5'), 0.5);
});

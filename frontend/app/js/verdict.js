// Reads the density answer's `fit` and `recommendation` (statistics core: SegmentedFit, SegmentedLogisticFit,
// NoFit, AdCapRecommender.Recommendation) defensively, and puts the break test's verdict into words. Pure.

/** A finite number from a JSON value (Jackson may write NaN as a string), else null. */
export function num(v) {
  const n = typeof v === 'string' && v.trim() !== '' ? Number(v) : v;
  return typeof n === 'number' && Number.isFinite(n) ? n : null;
}

const text = (v) => (typeof v === 'string' && v.trim() ? v.trim() : null);
const interval = (o) => (o && typeof o === 'object'
  ? { estimate: num(o.estimate), lower: num(o.lower), upper: num(o.upper) } : null);

/**
 * The fit in one shape: {model, reason, logistic, breakpoints, slopes, pValue, predict(x)}, or {message} when the
 * server explains why there is none, or null when the answer has no fit at all.
 */
export function readFit(raw) {
  if (!raw || typeof raw !== 'object') return null;
  let f = raw;
  for (const k of ['fit', 'chosen', 'result', 'segmented']) {
    if (raw[k] && typeof raw[k] === 'object' && !Array.isArray(raw[k])) { f = raw[k]; break; }
  }
  const model = text(raw.model) ?? text(raw.chosenModel) ?? text(raw.modelName) ?? text(f.model);
  const reason = text(raw.reason) ?? text(raw.modelReason) ?? text(raw.choiceReason) ?? text(f.selectionReason);
  if (!Array.isArray(f.slopes) || f.slopes.length === 0) {
    return { message: text(f.message) ?? text(raw.message) ?? text(raw.notice) ?? 'the server gave no fit', model };
  }
  const logistic = /logis|logit|binomial|glm/i.test(model ?? '') || 'deviance' in f;
  const breakpoints = (f.breakpoints ?? []).map((b) => ({
    estimate: num(b.estimate), lower: num(b.lower), upper: num(b.upper),
    slopeChange: num(b.slopeChange) ?? 0,
  })).filter((b) => b.estimate !== null);
  const slopes = f.slopes.map(interval);
  const intercept = num(f.intercept) ?? 0;
  const davies = f.davies ?? raw.davies ?? raw.breakTest ?? {};
  const pValue = num(davies.pValue) ?? num(raw.pValue) ?? num(f.pValue);
  const eta = (x) => breakpoints.reduce((y, b) => (x > b.estimate ? y + b.slopeChange * (x - b.estimate) : y),
    intercept + (slopes[0].estimate ?? 0) * x);
  return {
    model: model ?? (logistic ? 'segmented logistic regression' : 'segmented linear regression'),
    reason, logistic, breakpoints, slopes, pValue,
    predict: (x) => (logistic ? 1 / (1 + Math.exp(-eta(x))) : eta(x)),
  };
}

const ads = (fmt, x) => (Math.abs(x - Math.round(x)) < 0.05 ? fmt.count(Math.round(x)) : fmt.decimal(x, 1));
const pts = (fmt, perAd) => {
  const v = Math.abs(perAd * 100);
  return (v >= 2 ? fmt.count(v) : fmt.decimal(v, 1)) + (v === 1 ? ' point' : ' points');
};
const move = (fmt, perAd) => (perAd >= 0 ? 'rises' : 'falls') + ' about ' + pts(fmt, perAd);

/**
 * The verdict on bounce against ads on the entry page, in words, e.g. "Bounce stays flat up to 5 ads, then rises
 * about 7 points per extra ad".
 * @param fit  the result of readFit
 * @param xMin smallest and largest ad count observed
 */
export function densityVerdict(fit, fmt, xMin, xMax, alpha = 0.05) {
  if (!fit) return 'The server has not estimated a knee for this answer.';
  if (fit.message) return 'No knee could be estimated: ' + fit.message + '.';
  const test = fit.pValue === null ? '' : ` (break test ${fmt.pValue(fit.pValue)})`;
  const k = fit.breakpoints[0];
  const per = (a, b) => (b > a ? (fit.predict(b) - fit.predict(a)) / (b - a) : 0);
  if (!k || (fit.pValue !== null && fit.pValue >= alpha) || !(k.estimate > xMin && k.estimate < xMax)) {
    return `No clear knee: bounce ${move(fmt, per(xMin, xMax))} per extra ad across ${ads(fmt, xMin)} to `
      + `${ads(fmt, xMax)} ads${test}.`;
  }
  const before = fit.logistic ? per(xMin, k.estimate) : fit.slopes[0].estimate;
  const after = fit.logistic ? per(k.estimate, xMax) : fit.slopes[1]?.estimate ?? per(k.estimate, xMax);
  const s0 = fit.slopes[0];
  const flat = Math.abs(before) < 0.005
    || (!fit.logistic && s0.lower !== null && s0.upper !== null && s0.lower <= 0 && s0.upper >= 0);
  const range = k.lower !== null && k.upper !== null
    ? `; knee between ${ads(fmt, k.lower)} and ${ads(fmt, k.upper)} ads` : '';
  const head = flat ? `Bounce stays flat up to ${ads(fmt, k.estimate)} ads, then ${move(fmt, after)} per extra ad`
    : `Bounce ${move(fmt, before)} per extra ad up to ${ads(fmt, k.estimate)} ads, then ${move(fmt, after)
    } per extra ad`;
  return head + (test || range ? ' (' + [test.slice(2, -1), range.slice(2)].filter(Boolean).join('; ') + ')' : '')
    + '.';
}

/** The recommendation in one shape, or null: {cap, label, probability, gain, current, summary, caution}. */
export function readRecommendation(raw) {
  if (!raw || typeof raw !== 'object') return null;
  const caps = Array.isArray(raw.caps) ? raw.caps : Array.isArray(raw.entryCaps) ? raw.entryCaps : [];
  const pair = raw.recommended && typeof raw.recommended === 'object' ? raw.recommended : null;
  let cap = num(raw.recommendedCap) ?? num(raw.cap) ?? (pair ? num(pair.entryAdCount) : null);
  if (raw.recommendedCap && typeof raw.recommendedCap === 'object') cap = num(raw.recommendedCap.value);
  const label = pair && num(pair.laterAdCount) !== null
    ? `${pair.entryAdCount} ads on the entry page, ${pair.laterAdCount} on later pages` : null;
  const probability = num(pair?.probabilityBest) ?? num(raw.probabilityBest) ?? num(raw.probability)
    ?? num(caps.find((c) => num(c.adCount) === cap)?.probabilityBest);
  return {
    cap, label, probability,
    gain: interval(raw.expectedGainRpm ?? raw.expectedGain),
    current: num(raw.currentSessionRpm),
    summary: text(raw.summary),
    caution: text(raw.caution),
  };
}

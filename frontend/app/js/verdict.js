// Reads the knee fits and the ad-cap advice of the metrics answers (records FitSummary, KneeReport and CapAdvice,
// docs/metrics.md). Pure: no DOM.

/** A finite number from a JSON value, else null. */
export function num(v) {
  const n = typeof v === 'string' && v.trim() !== '' ? Number(v) : v;
  return typeof n === 'number' && Number.isFinite(n) ? n : null;
}

const text = (v) => (typeof v === 'string' && v.trim() ? v.trim() : null);
const noKnee = (why) => sentence(/^no[ t]/i.test(why) ? why : 'no knee: ' + why);
export const sentence = (s) => (s ? s[0].toUpperCase() + s.slice(1) + (/[.!?]$/.test(s) ? '' : '.') : '');

/** A FitSummary as {model, reason, breakpoints, slopes, pValue, breakFound, test, verdict, curve} or {notice}. */
export function readFit(raw) {
  if (!raw || typeof raw !== 'object') return null;
  const curve = (Array.isArray(raw.curve) ? raw.curve : []).map((p) => ({ x: num(p.x), y: num(p.y) }))
    .filter((p) => p.x !== null && p.y !== null);
  if (!curve.length) return { notice: text(raw.notice) ?? 'the server gave no fit' };
  const test = raw.breakTest ?? {};
  return {
    model: text(raw.model),
    reason: text(raw.reason),
    breakpoints: (raw.breakpoints ?? []).map((b) => ({ estimate: num(b.estimate), lower: num(b.lower),
      upper: num(b.upper) })).filter((b) => b.estimate !== null),
    slopes: (raw.slopes ?? []).map((s) => ({ estimate: num(s.estimate), lower: num(s.lower), upper: num(s.upper),
      unit: text(s.unit) })),
    pValue: num(test.pValue),
    breakFound: test.breakFound === true,
    test: text(test.method),
    verdict: text(raw.verdict),
    curve,
  };
}

/** The knee in words: the server's verdict with the break test's p-value, or why there is none. */
export function densityVerdict(fit, fmt) {
  if (!fit) return 'The server has not estimated a knee for this answer.';
  if (fit.notice) return noKnee(fit.notice);
  const k = fit.breakpoints[0];
  const words = fit.verdict ?? (fit.breakFound && k ? `the slope changes at ${fmt.decimal(k.estimate, 1)} ads`
    : 'no clear knee');
  return sentence(words + (fit.pValue === null || words.includes('p =') ? '' : ` (break test ${fmt.pValue(fit.pValue)})`));
}

/**
 * The knee of a KneeReport: Kneedle's when found, else the segmented breakpoint when the break test found one;
 * `x` null with the reason otherwise. `words(x)` says what the knee means for this curve.
 */
export function kneeOf(report, notice, words) {
  let k = { x: null, reason: notice ?? 'the server gave no knee estimate' };
  if (report && typeof report === 'object') {
    const seg = readFit(report.segmented);
    if (report.kneedle?.found) k = { x: num(report.kneedle.knee), method: 'Kneedle' };
    else if (seg?.breakFound && seg.breakpoints.length) k = { x: seg.breakpoints[0].estimate, method: 'segmented fit' };
    else k.reason = text(report.kneedle?.reason) ?? seg?.notice ?? 'no knee found';
  }
  k.text = k.x === null ? noKnee(k.reason) : `Knee (${k.method}): ${words(k.x)}.`;
  return k;
}

/** CapAdvice as {cap, probability, gain, current, summary, caution, pair, caps}, money in currency units. */
export function readAdvice(raw) {
  if (!raw || typeof raw !== 'object') return null;
  const m = (v) => (num(v) === null ? null : num(v) / 1e6);
  return {
    cap: num(raw.cap),
    probability: num(raw.probabilityBest),
    gain: { estimate: m(raw.expectedGainMicros), lower: m(raw.expectedGainLower), upper: m(raw.expectedGainUpper) },
    current: m(raw.currentSessionRpmMicros),
    summary: text(raw.summary),
    caution: text(raw.caution),
    pair: num(raw.entryCap) === null ? null : { entry: num(raw.entryCap), later: num(raw.laterCap),
      probability: num(raw.pairProbabilityBest), summary: text(raw.pairSummary) },
    caps: (Array.isArray(raw.caps) ? raw.caps : []).map((c) => ({ ads: num(c.ads), enough: c.status !== 'not_enough_data',
      note: text(c.note), pages: num(c.pages), sessionRpm: m(c.sessionRpmMicros), lower: m(c.lower), upper: m(c.upper),
      probabilityBest: num(c.probabilityBest) })),
  };
}

// Reads the knee fits and the ad-cap advice of the metrics answers (records FitSummary, KneeReport and CapAdvice,
// docs/metrics.md). Pure: no DOM.

export const num = (v) => (Number.isFinite(v) ? v : null);

export const sentence = (s) => (s ? s[0].toUpperCase() + s.slice(1) + (/[.!?]$/.test(s) ? '' : '.') : '');
const noKnee = (why) => sentence(/^no[ t]/i.test(why) ? why : 'no knee: ' + why);

export function readFit(raw) {
  if (!raw) return null;
  if (!raw.curve?.length) return { notice: raw.notice ?? 'the server gave no fit' };
  const test = raw.breakTest ?? {};
  return { ...raw, breakpoints: raw.breakpoints ?? [], slopes: raw.slopes ?? [], pValue: num(test.pValue),
    breakFound: !!test.breakFound, test: test.method };
}

export function densityVerdict(fit, fmt) {
  if (!fit) return 'The server has not estimated a knee for this answer.';
  if (fit.notice) return noKnee(fit.notice);
  const k = fit.breakpoints[0];
  const words = fit.verdict ?? (fit.breakFound && k ? `the slope changes at ${fmt.decimal(k.estimate, 1)} ads`
    : 'no clear knee');
  return sentence(words + (fit.pValue === null || words.includes('p =') ? ''
    : ` (break test ${fmt.pValue(fit.pValue)})`));
}

export function kneeOf(report, notice, words) {
  const seg = readFit(report?.segmented);
  const k = report?.kneedle?.found ? { x: report.kneedle.knee, method: 'Kneedle' }
    : seg?.breakFound && seg.breakpoints.length ? { x: seg.breakpoints[0].estimate, method: 'segmented fit' }
      : { x: null, reason: report ? report.kneedle?.reason ?? seg?.notice ?? 'no knee found'
        : notice ?? 'the server gave no knee estimate' };
  k.text = k.x === null ? noKnee(k.reason) : `Knee (${k.method}): ${words(k.x)}.`;
  return k;
}

export function readAdvice(raw) {
  if (!raw) return null;
  const m = (v) => (num(v) === null ? null : v / 1e6);
  return {
    cap: num(raw.cap),
    probability: num(raw.probabilityBest),
    gain: { estimate: m(raw.expectedGainMicros), lower: m(raw.expectedGainLower), upper: m(raw.expectedGainUpper) },
    summary: raw.summary,
    pairSummary: raw.pairSummary,
    caution: raw.caution,
    caps: (raw.caps ?? []).map((c) => ({ ...c, enough: c.status !== 'not_enough_data',
      sessionRpm: m(c.sessionRpmMicros), lower: m(c.lower), upper: m(c.upper) })),
  };
}

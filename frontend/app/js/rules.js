// Alert rules (docs/alerts.md) between the API's body and the rule form's fields, in the units people read:
// rates in percent, session RPM in the site's currency, durations in hours. Pure: no DOM.

export const METRICS = [['bounceRate', 'Bounce rate'], ['pagesPerSession', 'Pages per session'],
  ['sessionRpm', 'Session RPM'], ['viewabilityRate', 'Viewability rate'], ['ctr', 'Click-through rate']];

// our own words for where a rule stands, and what each means
export const STATES = { CALM: ['Calm', 'nothing to report'], RAISED: ['Raised', 'in breach; notified'],
  EASING: ['Easing', 'recovered; waiting for “clears after”'], PAUSED: ['Paused', 'switched off'] };

const proportion = (m) => !/^(pagesPerSession|sessionRpm)$/.test(m);
// API value × unit = value on screen
const unit = (m) => (proportion(m) ? 100 : m === 'sessionRpm' ? 1e-6 : 1);
const round = (v) => +v.toPrecision(10);

/** A duration as java.time.Duration writes it (PT6H, PT1H30M, PT0S) in hours; null when it is not one. */
export function hours(d) {
  const m = /^PT(?:(\d+)H)?(?:(\d+)M)?(?:([\d.]+)S)?$/.exec(d);
  return m && d !== 'PT' ? +(m[1] ?? 0) + (m[2] ?? 0) / 60 + (m[3] ?? 0) / 3600 : null;
}

const duration = (h) => (h == null ? undefined : `PT${Math.round(h * 60)}M`);

/** "device=phone,tablet; country=PT" ⇄ {device: ['phone', 'tablet'], country: ['PT']} */
export const parseSegment = (text) => Object.fromEntries(text.split(';').map((p) => p.split('='))
  .filter(([k, v]) => k.trim() && v?.trim()).map(([k, v]) => [k.trim(), v.split(',').map((s) => s.trim())
    .filter(Boolean)]));

export const segmentText = (segment) => Object.entries(segment ?? {}).map(([k, v]) => `${k}=${v.join(',')}`)
  .join('; ');

/** The form's values, by field name, for a rule's definition (none: a new rule with the documented defaults). */
export function toFields(d = {}) {
  const c = d.condition ?? { type: 'jump', by: 5 };
  const g = d.guard ?? {};
  return { name: d.name ?? '', metric: d.metric ?? 'bounceRate', segment: segmentText(d.segment),
    window: hours(d.window) ?? 1, 'condition.type': c.type, 'condition.threshold': c.threshold == null ? ''
      : round(c.threshold * unit(d.metric)),
    'condition.direction': c.direction ?? '', 'condition.by': c.by ?? '',
    'condition.baseline': c.baseline ?? 'trailingDays', 'condition.baselinePeriods': c.baselinePeriods ?? '',
    'guard.minSessions': g.minSessions ?? 200, 'guard.confidence': g.confidence ?? 0.95,
    cooldown: hours(d.cooldown) ?? 6, clearsAfter: hours(d.clearsAfter) ?? 2, paused: d.enabled === false };
}

/**
 * The API's body from the form's values, over the rule as it was (so webhooks and e-mail addresses stay); the test
 * method is kept only while metric and condition stay the same kind, else the server picks the right one.
 */
export function toRule(v, old = {}) {
  const jump = v['condition.type'] === 'jump';
  const same = v.metric === old.metric && v['condition.type'] === old.condition?.type;
  const or = (x) => (x === '' || x == null ? undefined : x);
  return { ...old, name: v.name, metric: v.metric, segment: parseSegment(v.segment), window: duration(v.window),
    condition: jump ? { type: 'jump', direction: or(v['condition.direction']), by: v['condition.by'],
      baseline: v['condition.baseline'], baselinePeriods: or(v['condition.baselinePeriods']) }
      : { type: v['condition.type'], threshold: v['condition.threshold'] == null ? null
        : round(v['condition.threshold'] / unit(v.metric)) },
    guard: { minSessions: v['guard.minSessions'], confidence: v['guard.confidence'],
      method: same ? old.guard?.method : undefined },
    cooldown: duration(v.cooldown), clearsAfter: duration(v.clearsAfter), enabled: !v.paused };
}

/** A value of the metric for people (session RPM comes in micro-units of the currency). */
export const metricValue = (fmt, m, v) => (proportion(m) ? fmt.percent(v) : m === 'sessionRpm'
  ? fmt.money(v == null ? v : v / 1e6) : fmt.decimal(v, 2));

// The overview metrics as the API names them (docs/metrics.md), with how each is shown. Pure: no DOM.

/** kind: count | rate (0..1) | mean (decimal) | duration (ms) | money (API values in micro-units). */
export const METRICS = [
  { name: 'sessions', label: 'Sessions', kind: 'count' },
  { name: 'pageviews', label: 'Pageviews', kind: 'count' },
  { name: 'bounceRate', label: 'Bounce rate', kind: 'rate', lowerIsBetter: true },
  { name: 'pagesPerSession', label: 'Pages per session', kind: 'mean' },
  { name: 'engagedMsPerSession', label: 'Engaged time per session', kind: 'duration' },
  { name: 'revenue', label: 'Revenue', kind: 'money' },
  { name: 'pageRpm', label: 'Page RPM', kind: 'money', hint: 'revenue per 1,000 pageviews' },
  { name: 'sessionRpm', label: 'Session RPM', kind: 'money', hint: 'revenue per 1,000 sessions' },
  { name: 'ecpm', label: 'eCPM', kind: 'money', hint: 'revenue per 1,000 ad impressions' },
  { name: 'impressions', label: 'Ad impressions', kind: 'count' },
  { name: 'viewabilityRate', label: 'Viewability', kind: 'rate' },
  { name: 'clicks', label: 'Ad clicks', kind: 'count' },
  { name: 'ctr', label: 'Click-through rate', kind: 'rate' },
];

export const METRIC_NAMES = METRICS.map((m) => m.name);

export function metric(name) {
  return METRICS.find((m) => m.name === name) ?? METRICS[0];
}

/** The value of a metric in an Overview record (money from its …Micros field). */
export function overviewValue(overview, name) {
  if (!overview) return null;
  const m = metric(name);
  return m.kind === 'money' ? overview[name + 'Micros'] ?? null : overview[name] ?? null;
}

/** A metric value (as the API gives it in series and overviews) in words and digits. */
export function formatMetric(fmt, name, value) {
  if (value === null || value === undefined || Number.isNaN(value)) return '–';
  switch (metric(name).kind) {
    case 'count': return fmt.count(value);
    case 'rate': return fmt.percent(value);
    case 'duration': return fmt.duration(value);
    case 'money': return fmt.money(value / 1e6);
    default: return fmt.decimal(value, 2);
  }
}

/** A change against the previous period, in the metric's own unit (rates in percentage points). */
export function formatChange(fmt, name, change) {
  if (change === null || change === undefined || Number.isNaN(change)) return '–';
  switch (metric(name).kind) {
    case 'count': return fmt.signed(change, 0);
    case 'rate': return fmt.points(change);
    case 'duration': return (change < 0 ? '−' : '+') + fmt.duration(Math.abs(change));
    case 'money': return (change < 0 ? '−' : '+') + fmt.money(Math.abs(change) / 1e6);
    default: return fmt.signed(change, Math.abs(change) < 0.01 ? 3 : 2);
  }
}

// The overview metrics as the API names them (docs/metrics.md), with how each is shown. Pure: no DOM.

// kind: count | rate (0..1) | mean | duration (ms) | money (micro-units in the API)
export const METRICS = [['sessions', 'Sessions', 'count'], ['pageviews', 'Pageviews', 'count'],
  ['bounceRate', 'Bounce rate', 'rate'], ['pagesPerSession', 'Pages per session', 'mean'],
  ['engagedMsPerSession', 'Engaged time per session', 'duration'], ['revenue', 'Revenue', 'money'],
  ['pageRpm', 'Page RPM', 'money', 'revenue per 1,000 pageviews'],
  ['sessionRpm', 'Session RPM', 'money', 'revenue per 1,000 sessions'],
  ['ecpm', 'eCPM', 'money', 'revenue per 1,000 ad impressions'], ['impressions', 'Ad impressions', 'count'],
  ['viewabilityRate', 'Viewability', 'rate'], ['clicks', 'Ad clicks', 'count'], ['ctr', 'Click-through rate', 'rate'],
].map(([name, label, kind, hint]) => ({ name, label, kind, hint, lowerIsBetter: name === 'bounceRate' }));

export const METRIC_NAMES = METRICS.map((m) => m.name);

export const metric = (name) => METRICS.find((m) => m.name === name) ?? METRICS[0];

export const overviewValue = (overview, name) => overview?.[name + (metric(name).kind === 'money' ? 'Micros' : '')]
  ?? null;

export function formatMetric(fmt, name, v) {
  const kind = metric(name).kind;
  return v == null ? '–' : kind === 'money' ? fmt.money(v / 1e6) : kind === 'mean' ? fmt.decimal(v, 2)
    : fmt[{ count: 'count', rate: 'percent', duration: 'duration' }[kind]](v);
}

export function formatChange(fmt, name, change) {
  const kind = metric(name).kind;
  const sign = change < 0 ? '−' : '+';
  return change == null ? '–' : kind === 'count' ? fmt.signed(change) : kind === 'rate' ? fmt.points(change)
    : kind === 'duration' ? sign + fmt.duration(Math.abs(change))
      : kind === 'money' ? sign + fmt.money(Math.abs(change) / 1e6)
      : fmt.signed(change, Math.abs(change) < 0.01 ? 3 : 2);
}

// Calendar arithmetic on ISO dates (YYYY-MM-DD) and the date presets of the segment bar. Pure: no DOM.

const DAY = 86_400_000;

export const PRESETS = [
  { id: '7d', label: 'Last 7 days', days: 7 },
  { id: '28d', label: 'Last 28 days', days: 28 },
  { id: '90d', label: 'Last 90 days', days: 90 },
  { id: 'month', label: 'This month' },
  { id: 'last-month', label: 'Last month' },
];

export function isIsoDate(s) {
  if (typeof s !== 'string' || !/^\d{4}-\d{2}-\d{2}$/.test(s)) return false;
  const d = new Date(s + 'T00:00:00Z');
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
}

export function addDays(iso, n) {
  return new Date(Date.parse(iso + 'T00:00:00Z') + n * DAY).toISOString().slice(0, 10);
}

/** Days from `from` to `to`, both included. */
export function daysIn(from, to) {
  return Math.round((Date.parse(to + 'T00:00:00Z') - Date.parse(from + 'T00:00:00Z')) / DAY) + 1;
}

/** Today's date in an IANA time zone (the site's day, as the API counts days). */
export function todayIn(timeZone, now = new Date()) {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' })
    .formatToParts(now);
  const get = (t) => parts.find((p) => p.type === t).value;
  return `${get('year')}-${get('month')}-${get('day')}`;
}

export function presetRange(id, today) {
  const p = PRESETS.find((x) => x.id === id);
  if (!p) return null;
  if (p.days) return { from: addDays(today, 1 - p.days), to: today };
  const first = today.slice(0, 8) + '01';
  if (id === 'month') return { from: first, to: today };
  const end = addDays(first, -1);
  return { from: end.slice(0, 8) + '01', to: end };
}

/** The preset whose range equals from..to today, or null. */
export function matchPreset(from, to, today) {
  return PRESETS.find((p) => {
    const r = presetRange(p.id, today);
    return r.from === from && r.to === to;
  })?.id ?? null;
}

/** The period of the same length just before from..to (what compare=previous compares with). */
export function previousRange(from, to) {
  const n = daysIn(from, to);
  return { from: addDays(from, -n), to: addDays(from, -1) };
}

// Calendar arithmetic on ISO dates (YYYY-MM-DD) and the date presets of the segment bar. Pure: no DOM.

const DAY = 86_400_000;

export const PRESETS = [['7d', 'Last 7 days', 7], ['28d', 'Last 28 days', 28], ['90d', 'Last 90 days', 90],
  ['month', 'This month'], ['last-month', 'Last month']].map(([id, label, days]) => ({ id, label, days }));

export function isIsoDate(s) {
  if (typeof s !== 'string' || !/^\d{4}-\d{2}-\d{2}$/.test(s)) return false;
  const d = new Date(s + 'T00:00:00Z');
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
}

export function addDays(iso, n) {
  return new Date(Date.parse(iso + 'T00:00:00Z') + n * DAY).toISOString().slice(0, 10);
}

export function daysIn(from, to) {
  return Math.round((Date.parse(to + 'T00:00:00Z') - Date.parse(from + 'T00:00:00Z')) / DAY) + 1;
}

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

export function previousRange(from, to) {
  const n = daysIn(from, to);
  return { from: addDays(from, -n), to: addDays(from, -1) };
}

// CSV (RFC 4180) of a chart's data with the API's numbers unformatted. Pure.

function cell(v) {
  if (v == null || Number.isNaN(v) || v === Infinity || v === -Infinity) return '';
  let s = String(v);
  // a text cell starting like a formula would be evaluated by spreadsheets (CSV injection): quote it as text
  if (typeof v === 'string' && /^[=+\-@\t\r]/.test(s)) s = "'" + s;
  return /[",\r\n]/.test(s) ? '"' + s.replaceAll('"', '""') + '"' : s;
}

export const toCsv = (columns, rows) => [columns.map((c) => c.label), ...rows.map((r) => columns.map((c) => (c.csv
  ? c.csv(r) : r[c.key])))].map((line) => line.map(cell).join(',') + '\r\n').join('');

export function fileName(parts, ext) {
  return parts.filter(Boolean).join('-').toLowerCase().replace(/[^a-z0-9.-]+/g, '-').replace(/-+/g, '-') + '.' + ext;
}

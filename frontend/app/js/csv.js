// CSV (RFC 4180) of a chart's data with the API's numbers unformatted. Pure.

function cell(v) {
  if (v === null || v === undefined || (typeof v === 'number' && !Number.isFinite(v))) return '';
  let s = String(v);
  // a text cell starting like a formula would be evaluated by spreadsheets (CSV injection): quote it as text
  if (typeof v === 'string' && /^[=+\-@\t\r]/.test(s)) s = "'" + s;
  return /[",\r\n]/.test(s) ? '"' + s.replaceAll('"', '""') + '"' : s;
}

/** columns: [{key, label, csv?(row)}] */
export function toCsv(columns, rows) {
  const lines = [columns.map((c) => cell(c.label)).join(',')];
  for (const r of rows) lines.push(columns.map((c) => cell(c.csv ? c.csv(r) : r[c.key])).join(','));
  return lines.join('\r\n') + '\r\n';
}

/** A file name from parts: lower case, safe characters only. */
export function fileName(parts, ext) {
  return parts.filter(Boolean).join('-').toLowerCase().replace(/[^a-z0-9.-]+/g, '-').replace(/-+/g, '-') + '.' + ext;
}

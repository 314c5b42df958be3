// Numbers for people: the site's currency and the reader's locale (Intl). Pure: no DOM.

const MINUS = '\u2212';
const DASH = '–';
const ok = (v) => typeof v === 'number' && Number.isFinite(v);

export function makeFormat(locale, currency = 'EUR') {
  const cache = new Map();
  const nf = (opts) => {
    const key = JSON.stringify(opts);
    if (!cache.has(key)) cache.set(key, new Intl.NumberFormat(locale, opts));
    return cache.get(key);
  };
  const fixed = (n, digits) => nf({ minimumFractionDigits: digits, maximumFractionDigits: digits }).format(n);
  const signed = (n, digits = 0, unit = '') => (ok(n) ? (n < 0 ? MINUS : '+') + fixed(Math.abs(n), digits) + unit
    : DASH);
  const day = (opts) => new Intl.DateTimeFormat(locale, { ...opts, timeZone: 'UTC' });
  const fmt = {
    locale,
    currency,
    count: (n) => (ok(n) ? fixed(n, 0) : DASH),
    decimal: (n, digits = 2) => (ok(n) ? fixed(n, digits) : DASH),
    sig: (n, digits = 3) => (ok(n) ? nf({ maximumSignificantDigits: digits }).format(n) : DASH),
    percent: (p, digits = 1) => (ok(p)
      ? nf({ style: 'percent', minimumFractionDigits: digits, maximumFractionDigits: digits }).format(p) : DASH),
    money: (v) => {
      if (!ok(v)) return DASH;
      const usual = nf({ style: 'currency', currency });
      const d = usual.resolvedOptions().maximumFractionDigits;
      return (v && Math.abs(v) < (d ? 10 ** (1 - d) : 1)
        ? nf({ style: 'currency', currency, maximumSignificantDigits: 3 }) : usual).format(v);
    },
    points: (d) => signed(ok(d) ? d * 100 : d, Math.abs(d) < 0.001 && d ? 2 : 1, ' pts'),
    signed,
    times: (r) => (ok(r) ? fixed(r, 2) + '×' : DASH),
    duration: (ms) => {
      if (!ok(ms)) return DASH;
      if (ms < 9950) return fixed(ms / 1000, 1) + ' s';
      const s = Math.round(ms / 1000);
      return s < 60 ? s + ' s' : `${fixed(Math.floor(s / 60), 0)} min ${String(s % 60).padStart(2, '0')} s`;
    },
    // a calendar day: no time zone shift
    date: (iso, opts = { day: 'numeric', month: 'short', year: 'numeric' }) => (iso?.length >= 10
      ? day(opts).format(new Date(iso.slice(0, 10) + 'T00:00Z')) : DASH),
    // a local hour of the site, as the API writes it: 2026-11-30T14:00
    hour: (iso) => (iso?.length >= 16 ? fmt.date(iso, { day: 'numeric', month: 'short' }) + ' ' + iso.slice(11, 16)
      : DASH),
    when: (iso) => (iso ? new Date(iso).toLocaleString(locale, { dateStyle: 'medium', timeStyle: 'short' }) : 'never'),
    range: (from, to) => fmt.date(from) + ' – ' + fmt.date(to),
    pValue: (p) => (!ok(p) ? 'p not available' : p < 0.001 ? 'p < 0.001' : 'p = ' + fmt.sig(p, 2)),
  };
  return fmt;
}

export function countryName(locale, code) {
  if (!code) return DASH;
  try {
    const name = new Intl.DisplayNames([locale], { type: 'region' }).of(code);
    return name && name !== code ? `${name} (${code})` : code;
  } catch {
    return code;
  }
}

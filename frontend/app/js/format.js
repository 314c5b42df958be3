// Numbers for people: the site's currency and the reader's locale (Intl). Pure: no DOM.

const MINUS = '\u2212';

/** Formatters for a locale (BCP 47) and the site's currency (ISO 4217); money in currency units, not micros. */
export function makeFormat(locale, currency = 'EUR') {
  const cache = new Map();
  const nf = (opts) => {
    const key = JSON.stringify(opts);
    if (!cache.has(key)) cache.set(key, new Intl.NumberFormat(locale, opts));
    return cache.get(key);
  };
  const finite = (v) => typeof v === 'number' && Number.isFinite(v);
  const dash = '–';
  const fmt = {
    locale,
    currency,
    count: (n) => (finite(n) ? nf({ maximumFractionDigits: 0 }).format(n) : dash),
    decimal: (n, digits = 2) => (finite(n)
      ? nf({ minimumFractionDigits: digits, maximumFractionDigits: digits }).format(n) : dash),
    percent: (p, digits = 1) => (finite(p)
      ? nf({ style: 'percent', minimumFractionDigits: digits, maximumFractionDigits: digits }).format(p) : dash),
    /** Money with the currency's usual decimals; small amounts (under 0.10 €, 1 ¥) keep 3 significant digits. */
    money: (v) => {
      if (!finite(v)) return dash;
      const usual = nf({ style: 'currency', currency });
      const d = usual.resolvedOptions().maximumFractionDigits;
      return (v !== 0 && Math.abs(v) < (d ? 10 ** (1 - d) : 1)
        ? nf({ style: 'currency', currency, maximumSignificantDigits: 3 }) : usual).format(v);
    },
    /** A difference of proportions in percentage points, signed. */
    points: (d, digits = Math.abs(d) < 0.001 && d !== 0 ? 2 : 1) => {
      if (!finite(d)) return dash;
      const abs = nf({ minimumFractionDigits: digits, maximumFractionDigits: digits }).format(Math.abs(d) * 100);
      return (d < 0 ? MINUS : '+') + abs + ' pts';
    },
    signed: (n, digits = 0) => {
      if (!finite(n)) return dash;
      const abs = nf({ minimumFractionDigits: digits, maximumFractionDigits: digits }).format(Math.abs(n));
      return (n < 0 ? MINUS : '+') + abs;
    },
    times: (r) => (finite(r) ? nf({ minimumFractionDigits: 2, maximumFractionDigits: 2 }).format(r) + '×' : dash),
    /** Milliseconds as "4.2 s", "42 s" or "3 min 05 s". */
    duration: (ms) => {
      if (!finite(ms)) return dash;
      if (ms < 9950) return fmt.decimal(ms / 1000, 1) + ' s';
      const s = Math.round(ms / 1000);
      if (s < 60) return s + ' s';
      const m = Math.floor(s / 60);
      return nf({ maximumFractionDigits: 0 }).format(m) + ' min ' + String(s % 60).padStart(2, '0') + ' s';
    },
    /** An ISO date (YYYY-MM-DD) as a short local date, read as a calendar day (no time zone shift). */
    date: (iso, opts = { day: 'numeric', month: 'short', year: 'numeric' }) => {
      if (typeof iso !== 'string' || iso.length < 10) return dash;
      return new Intl.DateTimeFormat(locale, { ...opts, timeZone: 'UTC' }).format(new Date(iso.slice(0, 10) + 'T00:00:00Z'));
    },
    /** A local date-time of the API (YYYY-MM-DDTHH:mm) as "3 Mar, 14:00". */
    hour: (iso) => new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZone: 'UTC' })
      .format(new Date(iso + ':00Z')),
    range: (from, to) => fmt.date(from) + ' – ' + fmt.date(to),
    pValue: (p) => (!finite(p) ? 'p not available' : p < 0.001 ? 'p < 0.001'
      : 'p = ' + nf({ maximumSignificantDigits: 2 }).format(p)),
  };
  return fmt;
}

/** The country name in the reader's language, with its code ("Portugal (PT)"); the code when unknown. */
export function countryName(locale, code) {
  if (!code) return '–';
  try {
    const name = new Intl.DisplayNames([locale], { type: 'region' }).of(code);
    return name && name !== code ? `${name} (${code})` : code;
  } catch {
    return code;
  }
}

import { test } from 'node:test';
import assert from 'node:assert/strict';
import { makeFormat, countryName } from '../format.js';
import { formatMetric, formatChange, overviewValue } from '../metrics.js';

const en = makeFormat('en-US', 'EUR');
const de = makeFormat('de-DE', 'EUR');

test('money follows the site currency and the reader locale', () => {
  assert.equal(en.money(1234.5), '€1,234.50');
  assert.equal(de.money(1234.5), '1.234,50\u00a0€');
  assert.equal(makeFormat('en-GB', 'USD').money(2), 'US$2.00');
  // yen have no minor unit: no decimals, except for amounts under one yen
  assert.equal(makeFormat('ja-JP', 'JPY').money(1200), '￥1,200');
  assert.equal(makeFormat('ja-JP', 'JPY').money(0.354), '￥0.354');
});

test('small amounts keep two or three significant digits instead of showing zero', () => {
  assert.equal(en.money(0.0075), '€0.0075');
  assert.equal(en.money(0.001234), '€0.00123');
  assert.equal(en.money(0.012), '€0.012');
  assert.equal(en.money(0.07), '€0.07');
  assert.equal(en.money(0.008), '€0.008');
  assert.equal(en.money(0.5), '€0.50');
  assert.equal(en.money(0), '€0.00');
});

test('rates, points, counts and durations', () => {
  assert.equal(en.percent(0.4567), '45.7%');
  assert.equal(de.percent(0.4567), '45,7\u00a0%');
  assert.equal(en.points(0.0123), '+1.2 pts');
  assert.equal(en.points(-0.07), '\u22127.0 pts');
  assert.equal(en.points(-0.0003), '\u22120.03 pts');
  assert.equal(en.count(1234567), '1,234,567');
  assert.equal(de.count(1234567), '1.234.567');
  assert.equal(en.duration(41_000), '41 s');
  assert.equal(en.duration(420), '0.4 s');
  assert.equal(en.duration(185_000), '3 min 05 s');
  assert.equal(en.times(1.0667), '1.07×');
  assert.equal(en.pValue(0.0002), 'p < 0.001');
  assert.equal(en.pValue(0.0321), 'p = 0.032');
});

test('missing values show a dash, never NaN', () => {
  for (const f of [en.count, en.percent, en.money, en.points, en.duration, en.times]) {
    assert.equal(f(null), '–');
    assert.equal(f(Number.NaN), '–');
  }
});

test('dates are calendar days, not shifted by the reader time zone', () => {
  assert.equal(en.date('2026-03-01'), 'Mar 1, 2026');
  assert.equal(de.date('2026-03-01'), '1. März 2026');
});

test('metrics are formatted by kind; money metrics come in micros', () => {
  assert.equal(formatMetric(en, 'sessionRpm', 1_875_000), '€1.88');
  assert.equal(formatMetric(en, 'bounceRate', 0.75), '75.0%');
  assert.equal(formatMetric(en, 'engagedMsPerSession', 10_250), '10 s');
  assert.equal(formatMetric(en, 'sessions', null), '–');
  assert.equal(formatChange(en, 'bounceRate', -0.021), '\u22122.1 pts');
  assert.equal(formatChange(en, 'revenue', -2_500_000), '−€2.50');
  assert.equal(formatChange(en, 'pagesPerSession', -0.004), '\u22120.004');
  assert.equal(overviewValue({ pageRpm: 1.5, pageRpmMicros: 1_500_000 }, 'pageRpm'), 1_500_000);
});

test('country names in the reader language', () => {
  assert.equal(countryName('en', 'PT'), 'Portugal (PT)');
  assert.equal(countryName('de', 'ES'), 'Spanien (ES)');
  assert.equal(countryName('en', ''), '–');
});

test('a local hour of the site reads as its day and clock time, whatever the browser\'s time zone', () => {
  const f = makeFormat('en-GB', 'EUR');
  assert.equal(f.hour('2026-03-29T02:00'), '29 Mar 02:00');   // the hour the clocks skip in Europe still reads as sent
  assert.equal(f.hour(null), '–');
});

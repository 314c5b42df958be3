import { test } from 'node:test';
import assert from 'node:assert/strict';
import { toCsv, fileName } from '../csv.js';

const columns = [
  { key: 'path', label: 'Entry path' },
  { key: 'sessions', label: 'Sessions' },
  { key: 'rate', label: 'Bounce rate (0-1)', csv: (r) => r.bounces / r.sessions },
];

test('numbers are written exactly as the API gave them', () => {
  const csv = toCsv(columns, [{ path: '/a', sessions: 3, bounces: 1 }]);
  assert.equal(csv, 'Entry path,Sessions,Bounce rate (0-1)\r\n/a,3,0.3333333333333333\r\n');
});

test('commas, quotes and line breaks are quoted; missing values are empty', () => {
  const csv = toCsv(columns.slice(0, 2), [{ path: '/x?a=1,2&b="q"', sessions: null }, { path: 'two\nlines', sessions: NaN }]);
  assert.equal(csv, 'Entry path,Sessions\r\n"/x?a=1,2&b=""q""",\r\n"two\nlines",\r\n');
});

test('text that a spreadsheet would run as a formula is kept as text; negative numbers stay numbers', () => {
  const csv = toCsv([{ key: 'v', label: 'v' }], [{ v: '=HYPERLINK("x")' }, { v: -1.5 }, { v: '@cmd' }]);
  assert.equal(csv, 'v\r\n"\'=HYPERLINK(""x"")"\r\n-1.5\r\n\'@cmd\r\n');
});

test('file names are safe', () => {
  assert.equal(fileName(['Foldline', 'density', 'Bounce by ads', '2026-03-01'], 'csv'),
    'foldline-density-bounce-by-ads-2026-03-01.csv');
  assert.equal(fileName(['a/../b', null, 'c'], 'png'), 'a-..-b-c.png');
});

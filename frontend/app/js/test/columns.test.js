import { test } from 'node:test';
import assert from 'node:assert/strict';
import { parseColumns } from '../columns.js';

// Issue #4: the fit screen takes two or three columns pasted from a spreadsheet or a CSV file.
test('tab, comma, semicolon and space separated columns, with and without a header', () => {
  const expected = [[0, 1, 2], [0.5, 0.25, -1e-3]];
  assert.deepEqual(parseColumns('ads\tbounce\n0\t0.5\n1\t0.25\n2\t-1e-3\n').columns, expected);
  assert.deepEqual(parseColumns('"x","y"\r\n0,0.5\r\n1,.25\r\n2,-0.001').names, ['x', 'y']);
  assert.deepEqual(parseColumns('"x","y"\r\n0,0.5\r\n1,.25\r\n2,-0.001').columns, expected);
  assert.deepEqual(parseColumns('0 0.5\n1   0.25\n\n2 -0.001\n'), { names: ['x', 'y'], columns: expected });
  // a European spreadsheet: semicolons and decimal commas, or tabs and decimal commas
  assert.deepEqual(parseColumns('x;y\n0;0,5\n1;0,25\n2;-0,001').columns, expected);
  assert.deepEqual(parseColumns('0\t0,5\n1\t0,25\n2\t-0,001').columns, expected);
});

test('a third column (weights or trials) comes along', () => {
  const p = parseColumns('ads,bounces,sessions\n0,10,100\n1,12,90\n2,30,80');
  assert.deepEqual(p.names, ['ads', 'bounces', 'sessions']);
  assert.deepEqual(p.columns[2], [100, 90, 80]);
});

test('what is not two or three numeric columns is refused with the line', () => {
  assert.throws(() => parseColumns('  \n'), /Paste two or three columns/);
  assert.throws(() => parseColumns('1\n2\n3'), /line 1 has 1/);
  assert.throws(() => parseColumns('1,2,3,4\n1,2,3,4'), /line 1 has 4/);
  assert.throws(() => parseColumns('x,y\n1,2\n3,four\n5,6'), /Line 3: “four” is not a number/);
  assert.throws(() => parseColumns('1,2\n3\n5,6'), /Line 2 has 1 values, not 2/);
  assert.throws(() => parseColumns('x,y\n1,2\n3,4'), /at least three rows/);
});

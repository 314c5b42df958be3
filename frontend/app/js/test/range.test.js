import { test } from 'node:test';
import assert from 'node:assert/strict';
import { addDays, daysIn, todayIn, presetRange, previousRange, isIsoDate } from '../range.js';

test('date arithmetic crosses months, leap days and daylight-saving changes', () => {
  assert.equal(addDays('2028-02-28', 1), '2028-02-29');
  assert.equal(addDays('2026-03-01', -1), '2026-02-28');
  assert.equal(addDays('2026-03-29', 1), '2026-03-30'); // EU clocks go forward on 29 March 2026
  assert.equal(daysIn('2026-01-01', '2026-01-28'), 28);
  assert.equal(daysIn('2026-03-01', '2026-03-01'), 1);
  assert.ok(isIsoDate('2028-02-29'));
  assert.ok(!isIsoDate('2026-02-29'));
  assert.ok(!isIsoDate('2026-1-01'));
});

test("today is the site's day, not the reader's", () => {
  const now = new Date('2026-03-10T23:30:00Z');
  assert.equal(todayIn('Europe/Lisbon', now), '2026-03-10');
  assert.equal(todayIn('Asia/Tokyo', now), '2026-03-11');
  assert.equal(todayIn('America/Los_Angeles', now), '2026-03-10');
});

test('presets end today and include it; months follow the calendar', () => {
  assert.deepEqual(presetRange('28d', '2026-03-10'), { from: '2026-02-11', to: '2026-03-10' });
  assert.deepEqual(presetRange('7d', '2026-03-10'), { from: '2026-03-04', to: '2026-03-10' });
  assert.deepEqual(presetRange('month', '2026-03-10'), { from: '2026-03-01', to: '2026-03-10' });
  assert.deepEqual(presetRange('last-month', '2026-03-10'), { from: '2026-02-01', to: '2026-02-28' });
  assert.equal(presetRange('forever', '2026-03-10'), null);
});

test('the previous period has the same length and ends the day before', () => {
  assert.deepEqual(previousRange('2026-03-01', '2026-03-28'), { from: '2026-02-01', to: '2026-02-28' });
  assert.deepEqual(previousRange('2026-03-10', '2026-03-10'), { from: '2026-03-09', to: '2026-03-09' });
});

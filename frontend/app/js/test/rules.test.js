import { test } from 'node:test';
import assert from 'node:assert/strict';
import { hours, parseSegment, segmentText, toFields, toRule, metricValue, STATES } from '../rules.js';
import { makeFormat } from '../format.js';

const fmt = makeFormat('en-US', 'EUR');

// a rule's definition as GET …/alerts/rules/{id} returns it (docs/alerts.md, "Rules"): every default filled in
const stored = {
  name: 'Phone bounce jump', metric: 'bounceRate', segment: { device: ['phone'] }, window: 'PT1H',
  condition: { type: 'jump', threshold: null, direction: 'up', by: 5, baseline: 'trailingDays', baselinePeriods: 7 },
  guard: { minSessions: 200, confidence: 0.95, method: 'newcombe' }, cooldown: 'PT6H', clearsAfter: 'PT2H',
  webhookIds: [3], emails: ['desk@news.example'], enabled: true,
};

test('durations in hours, as java.time.Duration writes them', () => {
  assert.equal(hours('PT1H'), 1);
  assert.equal(hours('PT168H'), 168);
  assert.equal(hours('PT1H30M'), 1.5);
  assert.equal(hours('PT90M'), 1.5);
  assert.equal(hours('PT0S'), 0);
  assert.equal(hours('PT0.5S'), 0.5 / 3600);
  for (const bad of ['', 'P', 'PT', '1H', 'PT1X', 'P1D', null, undefined]) assert.equal(hours(bad), null, String(bad));
});

test('the readers field: dimension=values separated by semicolons, values by commas', () => {
  assert.deepEqual(parseSegment(' device = phone, tablet ; country=PT;; browser= '),
    { device: ['phone', 'tablet'], country: ['PT'] });
  assert.deepEqual(parseSegment(''), {});
  assert.equal(segmentText({ device: ['phone', 'tablet'], country: ['PT'] }), 'device=phone,tablet; country=PT');
  assert.equal(segmentText(undefined), '');
});

test('a stored rule fills the form and comes back unchanged, webhooks, addresses and test method kept', () => {
  const f = toFields(stored);
  assert.equal(f.segment, 'device=phone');
  assert.equal(f.window, 1);
  assert.equal(f['condition.by'], 5);
  assert.equal(f['condition.threshold'], '');
  assert.equal(f.cooldown, 6);
  assert.equal(f.paused, false);
  const back = toRule({ ...f, 'guard.minSessions': 200, 'guard.confidence': 0.95 }, stored);
  assert.deepEqual(back.webhookIds, [3]);
  assert.deepEqual(back.emails, ['desk@news.example']);
  assert.deepEqual(back.segment, stored.segment);
  assert.deepEqual(back.condition, { type: 'jump', direction: 'up', by: 5, baseline: 'trailingDays',
    baselinePeriods: 7 });
  assert.deepEqual(back.guard, stored.guard);
  // durations go as minutes, which java.time.Duration.parse reads as the same duration
  assert.equal(back.window, 'PT60M');
  assert.equal(back.cooldown, 'PT360M');
  assert.equal(back.enabled, true);
});

test('thresholds in the units people read: percent for rates, the currency for session RPM (micro-units in the API)',
  () => {
    const rate = { ...stored, condition: { type: 'above', threshold: 0.07 } };
    assert.equal(toFields(rate)['condition.threshold'], 7);
    const v = { ...toFields(rate), 'condition.threshold': 45.5 };
    assert.deepEqual(toRule(v).condition, { type: 'above', threshold: 0.455 });
    const rpm = toRule({ ...v, metric: 'sessionRpm', 'condition.type': 'below', 'condition.threshold': 12.5 });
    assert.deepEqual(rpm.condition, { type: 'below', threshold: 12_500_000 });
    assert.equal(toFields({ ...stored, metric: 'sessionRpm', condition: { type: 'below', threshold: 12_500_000 } })[
      'condition.threshold'], 12.5);
    assert.equal(toRule({ ...v, metric: 'pagesPerSession', 'condition.threshold': 2.5 }).condition.threshold, 2.5);
    assert.equal(toRule({ ...v, 'condition.threshold': null }).condition.threshold, null);
  });

test('a new rule has the documented defaults; a changed kind of rule lets the server choose the test', () => {
  const f = toFields();
  assert.equal(f.metric, 'bounceRate');
  assert.equal(f['condition.type'], 'jump');
  assert.equal(f['guard.minSessions'], 200);
  assert.equal(f.clearsAfter, 2);
  const ctr = toRule({ ...f, metric: 'ctr', 'condition.by': 1, paused: true }, stored);
  assert.equal(ctr.guard.method, undefined);
  assert.equal(ctr.condition.direction, undefined);
  assert.equal(ctr.condition.baselinePeriods, undefined);
  assert.equal(ctr.enabled, false);
});

test('values of each metric for people, and a word for every state', () => {
  assert.equal(metricValue(fmt, 'bounceRate', 0.4123), '41.2%');
  assert.equal(metricValue(fmt, 'sessionRpm', 12_340_000), '€12.34');
  assert.equal(metricValue(fmt, 'pagesPerSession', 2.345), '2.35');
  assert.equal(metricValue(fmt, 'sessionRpm', null), '–');
  assert.deepEqual(Object.keys(STATES), ['CALM', 'RAISED', 'EASING', 'PAUSED']);
});

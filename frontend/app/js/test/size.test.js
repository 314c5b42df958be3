import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readdirSync, statSync } from 'node:fs';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';

// Issue #5: the front end's own code (HTML, CSS, JavaScript; not Chart.js, not these tests) stays under 100 KB.
test('the front end ships under 100,000 bytes of code, uncompressed', () => {
  const app = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
  let total = 0;
  const walk = (dir) => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      if (path === join(app, 'js', 'test')) continue;
      const s = statSync(path);
      if (s.isDirectory()) walk(path); else if (/\.(js|css|html)$/.test(name)) total += s.size;
    }
  };
  walk(app);
  assert.ok(total < 100_000, `front end is ${total} bytes`);
});

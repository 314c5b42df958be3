// Measures the tag against its budget (under 5 KB minified and gzipped). Not shipped: the pom excludes test/**.
//   node frontend/tag/test/size.mjs            naive minification (comments and indentation removed)
//   TERSER=/path/to/node_modules/terser node frontend/tag/test/size.mjs   also with terser (npm i terser@5)
import {readFileSync} from 'node:fs';
import {gzipSync} from 'node:zlib';
import {createRequire} from 'node:module';

const BUDGET = 5 * 1024;
const source = readFileSync(new URL('../tag.js', import.meta.url), 'utf8');
const gz = text => gzipSync(text, {level: 9}).length;
const naive = source
  .replace(/^\s*\/\/.*$/gm, '')          // whole-line comments
  .replace(/\s+\/\/ [^'\n]*$/gm, '')     // trailing comments (none sit inside strings in tag.js)
  .replace(/^\s+/gm, '')                 // indentation
  .replace(/\n+/g, '\n');
const rows = [['source', source], ['naive minified', naive]];
if (process.env.TERSER) {
  const {minify} = createRequire(import.meta.url)(process.env.TERSER);
  const out = await minify(source, {compress: {passes: 2}, mangle: true, format: {comments: /^!/}});
  rows.push(['terser', out.code]);
}
let over = false;
for (const [name, text] of rows) {
  const size = gz(text);
  over ||= name !== 'source' && size >= BUDGET;
  console.log(`${name.padEnd(15)} ${String(text.length).padStart(6)} B   gzip -9 ${String(size).padStart(5)} B`);
}
process.exit(over ? 1 : 0);

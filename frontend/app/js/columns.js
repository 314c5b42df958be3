// Columns pasted from a spreadsheet or a CSV file: tab, semicolon, comma or space separated, with or without a
// header, decimal commas where the separator is not a comma. Pure: no DOM.

export function parseColumns(text) {
  const lines = text.split(/\r?\n/).map((l) => l.trim()).filter(Boolean);
  if (!lines.length) throw new Error('Paste two or three columns of numbers first.');
  const sep = ['\t', ';', ','].find((s) => lines[0].includes(s)) ?? /\s+/;
  const cells = (line) => line.split(sep).map((c) => c.trim().replace(/^"(.*)"$/, '$1'));
  const number = (c) => (/^[-+]?(\d+([.,]\d*)?|[.,]\d+)(e[-+]?\d+)?$/i.test(c) ? +c.replace(',', '.') : NaN);
  const names = cells(lines[0]).some((c) => Number.isNaN(number(c))) && cells(lines.shift());
  const width = (names || cells(lines[0])).length;
  if (width < 2 || width > 3) throw new Error(`Paste two or three columns; line 1 has ${width}.`);
  const columns = [[], [], []].slice(0, width);
  lines.forEach((line, i) => {
    const row = cells(line);
    const n = i + (names ? 2 : 1);
    if (row.length !== width) throw new Error(`Line ${n} has ${row.length} values, not ${width}.`);
    row.forEach((c, j) => {
      if (Number.isNaN(number(c))) throw new Error(`Line ${n}: “${c}” is not a number.`);
      columns[j].push(number(c));
    });
  });
  if (lines.length < 3) throw new Error('Paste at least three rows of numbers.');
  return { names: names || ['x', 'y', 'third'].slice(0, width), columns };
}

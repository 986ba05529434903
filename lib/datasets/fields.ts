/**
 * One physical line of a dataset file split into fields under the contract's dialect (CONTRACT §7.2):
 * RFC 4180 quotes on one line, each malformed quote refused with its field's column.
 */

type SplitLine = { ok: true; fields: string[] } | { ok: false; column: number; message: string };

const isBlankChar = (c: string | undefined) => c === ' ' || c === '\t';

/** Splits one physical line into trimmed, unquoted fields; refuses malformed quotes with the field's column. */
export function splitFields(line: string, delimiter: string): SplitLine {
  const fields: string[] = [];
  let i = 0;
  let column = 1;
  for (;;) {
    let j = i;
    while (isBlankChar(line[j])) j++;
    if (line[j] === '"') {
      let k = j + 1;
      let value = '';
      for (;;) {
        const close = line.indexOf('"', k);
        if (close === -1) return { ok: false, column, message: 'unterminated quote (a quoted field must close on the same line)' };
        value += line.slice(k, close);
        if (line[close + 1] === '"') {
          value += '"';
          k = close + 2;
          continue;
        }
        k = close + 1;
        break;
      }
      while (isBlankChar(line[k])) k++;
      fields.push(value.replace(/^[ \t]+|[ \t]+$/g, ''));
      if (k >= line.length) return { ok: true, fields };
      if (line[k] !== delimiter) return { ok: false, column, message: 'text after a closing quote' };
      i = k + 1;
      column++;
      continue;
    }
    let end = line.indexOf(delimiter, j);
    if (end === -1) end = line.length;
    const raw = line.slice(j, end);
    if (raw.includes('"')) return { ok: false, column, message: 'a quote inside an unquoted field (enclose the whole field in quotes, with "" for a quote)' };
    fields.push(raw.replace(/[ \t]+$/, ''));
    if (end >= line.length) return { ok: true, fields };
    i = end + 1;
    column++;
  }
}

/** Counts `,` and `;` outside double quotes. */
export function delimitersOutsideQuotes(line: string): { comma: number; semicolon: number; unbalanced: boolean } {
  let inQuotes = false;
  let comma = 0;
  let semicolon = 0;
  for (const c of line) {
    if (c === '"') inQuotes = !inQuotes;
    else if (!inQuotes && c === ',') comma++;
    else if (!inQuotes && c === ';') semicolon++;
  }
  return { comma, semicolon, unbalanced: inQuotes };
}


// Sums the group reports of `scripts/mutation-group.sh` (reports/mutation/<group>.json) into one table:
// per file, per group and overall, killed (timeouts count as killed, as Stryker does), survived, no coverage, ignored.
// Usage: node scripts/mutation-summary.mjs [--survivors] [--keep DEVELOPERS.md]
// --keep <file>: the per-file rows of the score table in <file> (between `<!-- scores -->` markers) whose files no
// report here measures are kept as they are (their report files may be gone, e.g. on a fresh machine), so the
// totals cover every file measured so far; rows of files measured here are replaced.
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

const dir = path.resolve('reports/mutation');
// A file may be measured in parts (line ranges) by several groups, or again by a later run: each mutant (by
// place, operator and replacement) keeps its newest result, and the file is listed under its newest group.
const files = new Map();
const reports = (existsSync(dir) ? readdirSync(dir) : [])
  .filter((n) => n.endsWith('.json') && !n.startsWith('incremental-'))
  .map((name) => ({ name, time: statSync(path.join(dir, name)).mtimeMs }))
  .sort((a, b) => a.time - b.time);
for (const { name } of reports) {
  const report = JSON.parse(readFileSync(path.join(dir, name), 'utf8'));
  for (const [file, entry] of Object.entries(report.files ?? {})) {
    const known = files.get(file) ?? { mutants: new Map() };
    for (const m of entry.mutants) known.mutants.set(`${m.location.start.line}:${m.location.start.column}-${m.location.end.line}:${m.location.end.column}:${m.mutatorName}:${m.replacement}`, m);
    files.set(file, { group: name.replace(/\.json$/, ''), mutants: known.mutants, source: entry.source });
  }
}
for (const entry of files.values()) entry.mutants = [...entry.mutants.values()];
const counted = new Map();
for (const [file, { group, mutants }] of files) {
  const count = { killed: 0, survived: 0, noCoverage: 0, ignored: 0, errors: 0 };
  for (const m of mutants) {
    if (m.status === 'Killed' || m.status === 'Timeout') count.killed += 1;
    else if (m.status === 'Survived') count.survived += 1;
    else if (m.status === 'NoCoverage') count.noCoverage += 1;
    else if (m.status === 'Ignored') count.ignored += 1;
    else count.errors += 1;
  }
  counted.set(file, { file, group, ...count });
}
const keepAt = process.argv.indexOf('--keep');
if (keepAt !== -1) {
  const text = readFileSync(process.argv[keepAt + 1], 'utf8');
  const table = text.slice(text.indexOf('<!-- scores -->'), text.indexOf('<!-- /scores -->'));
  for (const line of table.split('\n')) {
    const cells = line.split('|').map((cell) => cell.trim());
    const file = /^`(.+)`$/.exec(cells[1] ?? '')?.[1];
    if (!file || counted.has(file)) continue;
    const [killed, survived, noCoverage, ignored] = cells.slice(3, 7).map(Number);
    counted.set(file, { file, group: cells[2], killed, survived, noCoverage, ignored, errors: 0 });
  }
}
const rows = [...counted.values()].sort((a, b) => (a.file < b.file ? -1 : a.file > b.file ? 1 : 0));
const total = { killed: 0, survived: 0, noCoverage: 0, ignored: 0, errors: 0 };
for (const row of rows) for (const key of Object.keys(total)) total[key] += row[key];
const score = (c) => {
  const valid = c.killed + c.survived + c.noCoverage;
  return valid === 0 ? 'n/a' : `${((100 * c.killed) / valid).toFixed(1)} %`;
};
console.log('| file | group | killed | survived | no coverage | ignored (static or words) | score |');
console.log('|---|---|---|---|---|---|---|');
for (const r of rows) console.log(`| \`${r.file}\` | ${r.group} | ${r.killed} | ${r.survived} | ${r.noCoverage} | ${r.ignored} | ${score(r)} |`);
console.log(`| **all measured** | | ${total.killed} | ${total.survived} | ${total.noCoverage} | ${total.ignored} | **${score(total)}** |`);
// One line a group (the target is 85 % killed in every group).
const groups = new Map();
for (const r of rows) {
  const g = groups.get(r.group) ?? { files: 0, killed: 0, survived: 0, noCoverage: 0, ignored: 0 };
  g.files += 1;
  for (const key of ['killed', 'survived', 'noCoverage', 'ignored']) g[key] += r[key];
  groups.set(r.group, g);
}
console.log('');
console.log('| group | files | killed | survived | no coverage | ignored | score |');
console.log('|---|---|---|---|---|---|---|');
for (const [name, g] of [...groups.entries()].sort()) console.log(`| ${name} | ${g.files} | ${g.killed} | ${g.survived} | ${g.noCoverage} | ${g.ignored} | ${score(g)} |`);
if (process.argv.includes('--survivors')) {
  for (const [file, { mutants, source }] of files) {
    const lines = source.split('\n');
    for (const m of mutants.filter((x) => x.status === 'Survived' || x.status === 'NoCoverage')) {
      const line = m.location.start.line;
      console.log(`${m.status} ${file}:${line}:${m.location.start.column} ${m.mutatorName}: ${lines[line - 1].trim().slice(0, 140)}  =>  ${String(m.replacement).replace(/\s+/g, ' ').slice(0, 100)}`);
    }
  }
}

// Command-line runner: evaluates a sheet document and prints its results as JSON.
//   npm run --silent calc -- <sheet.json>
// Exit codes: 0 every block ok; 1 any block error or blocked; 2 unreadable or invalid document.
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { evaluateSheet, parseSheetDocument } from '../lib/engine';

function fail(reason: string): never {
  process.stderr.write(`calc: ${reason}\n`);
  process.exit(2);
}

async function main(): Promise<void> {
  const args = process.argv.slice(2).filter((arg) => arg !== '--');
  if (args.length !== 1) fail('usage: npm run --silent calc -- <sheet.json>');
  const base = process.env.INIT_CWD ?? process.cwd();
  const file = path.resolve(base, args[0]!);
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    fail(`cannot read ${file}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    fail(`${file} is not JSON (${error instanceof Error ? error.message : 'parse error'})`);
  }
  const parsed = parseSheetDocument(json);
  if (!parsed.ok) fail(`invalid document: ${parsed.path ? `${parsed.path}: ` : ''}${parsed.message}`);
  const results = evaluateSheet(parsed.document);
  process.stdout.write(`${JSON.stringify(results, null, 2)}\n`);
  const allOk = Object.values(results.blocks).every((block) => block.status === 'ok');
  process.exitCode = allOk ? 0 : 1;
}

main().catch((error: unknown) => {
  process.stderr.write(`calc: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(2);
});

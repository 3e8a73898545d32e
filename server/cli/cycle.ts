/**
 * Cycle engine from the command line.
 *   npm run --silent cycle -- FILE.json        evaluate one cycle (or an array of cycles)
 *   npm run --silent cycle -- -                read the JSON from stdin
 *   npm run --silent cycle -- --csv FILE.json  one CSV row per input instead of JSON
 * Input shape: the body of POST /api/cycles/evaluate (see server/engine/README.md).
 * Bad input: exit code 2 and `{ "error": { "code", "field", "message" } }` on stdout.
 */
import { readFileSync } from 'node:fs';

import { stringify } from 'csv-stringify/sync';

import { evaluateRequestSchema } from '@/server/contracts/cycle';
import { EngineInputError, type CycleResult } from '@/server/engine';
import { ApiError, parse } from '@/server/http/errors';
import { evaluate } from '@/server/services/cycles';

const EXIT_BAD_INPUT = 2;

class UsageError extends Error {}

/** The figures of a result, one column each, in this order. */
const CSV_COLUMNS = [
  'netWorkKJPerKg',
  'thermalEfficiency',
  'heatInputKJPerKg',
  'compressorWorkKJPerKg',
  'turbineWorkKJPerKg',
  'backWorkRatio',
  'regeneratorDutyKJPerKg',
  'exhaustTemperatureK',
  'fuelAirRatio',
  'airMassFlowKgPerS',
  'fuelMassFlowKgPerS',
  'heatRateKJPerKWh',
  'co2KgPerMWh',
] as const satisfies readonly (keyof CycleResult)[];

function toCsv(results: CycleResult[]): string {
  const header = ['input', ...CSV_COLUMNS, 'warnings'];
  const rows = results.map((r, i) => [
    i + 1,
    ...CSV_COLUMNS.map((key) => r[key]),
    r.warnings.map((w) => w.code).join(' '),
  ]);
  return stringify([header, ...rows], { cast: { number: (n) => String(n) } });
}

/** The field an input error names, and its message for that field alone. */
function fieldError(error: ApiError): { field: string; message: string } {
  const field = error.details.field ?? '(body)';
  return { field, message: error.details.fieldErrors?.[field]?.[0] ?? error.message };
}

function evaluateOne(body: unknown, path: string): CycleResult {
  try {
    return evaluate(parse(evaluateRequestSchema, body));
  } catch (error) {
    if (error instanceof EngineInputError) throw ApiError.invalidField(path + error.field, error.message);
    if (error instanceof ApiError && path) {
      const { field, message } = fieldError(error);
      // A row that is not an object at all is named by its index alone (`0`, not `0.(body)`).
      throw ApiError.invalidField(field === '(body)' ? path.replace(/\.$/, '') : path + field, message);
    }
    throw error;
  }
}

function main(argv: string[]): number {
  const csv = argv.includes('--csv');
  const files = argv.filter((a) => a !== '--csv');
  if (files.length !== 1) throw new UsageError('Usage: npm run --silent cycle -- [--csv] FILE.json | -');
  const text = readFileSync(files[0] === '-' ? 0 : files[0], 'utf8');
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw ApiError.invalidField('(body)', 'The input is not valid JSON.');
  }
  const many = Array.isArray(body);
  const inputs = many ? (body as unknown[]) : [body];
  const results = inputs.map((input, i) => evaluateOne(input, many ? `${i}.` : ''));
  process.stdout.write(csv ? toCsv(results) : JSON.stringify(many ? results : results[0], null, 2) + '\n');
  return 0;
}

try {
  process.exitCode = main(process.argv.slice(2));
} catch (error) {
  if (error instanceof ApiError) {
    const { field, message } = fieldError(error);
    process.stdout.write(JSON.stringify({ error: { code: error.code, field, message } }) + '\n');
    process.exitCode = EXIT_BAD_INPUT;
  } else if (error instanceof UsageError || (error as NodeJS.ErrnoException)?.code === 'ENOENT') {
    process.stderr.write(`${(error as Error).message}\n`);
    process.exitCode = EXIT_BAD_INPUT;
  } else {
    throw error;
  }
}

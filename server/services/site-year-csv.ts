import { parse as parseCsv } from 'csv-parse/sync';

import type { SiteYearColumns } from '@/db/schema';
import {
  maxListedRowErrors,
  profileMaxK,
  profileMinK,
  yearHours,
  type ProfileRowError,
} from '@/server/contracts/site-year';
import { ApiError } from '@/server/http/errors';

/**
 * Reads an hourly ambient profile from CSV (csv-parse). The first line names the columns;
 * they are found by their names, in any order, letter case ignored:
 *
 * - time: `time`, `timestamp`, `date`, `datetime` (a date and time, e.g. 2025-01-01T00:00) or
 *   `hour`, `hour of year`, `hoy` (a whole hour number). Required; no two rows the same.
 * - dry-bulb temperature: a name with `temp`, `dry bulb`/`drybulb`/`dry-bulb` or `tdb`. The
 *   unit from the name — `°C`, `degC`, `(C)`, `[C]`, `_c`, `celsius` or `K`, `(K)`, `[K]`,
 *   `_k`, `kelvin` — else from the values: a column whose median is above 150 is in kelvin
 *   (no valid °C value is), otherwise in °C. Each value −60 °C to +60 °C.
 * - relative humidity: a name with `rh` or `humid`. `%` or `percent` in the name: percent;
 *   `fraction` or `0-1`: a fraction; else percent when any value is above 1.5, otherwise a
 *   fraction. Each value 0–100 %.
 * - pressure (optional): a name with `press` or `kpa`; kPa, or hPa/mbar or Pa when the name
 *   says so. Each value 5–120 kPa. Without it every hour has the basis pressure.
 * - hours (optional): `hours`, `weight` or `duration`: the hours the row stands for (above 0).
 *
 * Without an hours column the file has 8760 or 8784 rows; with one, its hours add up to
 * 8760 or 8784. Every bad row is listed (the first 20) with its line in the file (the header
 * is line 1) and its column, and nothing is stored.
 */

export type ParsedProfile = { columns: SiteYearColumns; rows: number; hours: number };

type Column = { index: number; name: string };

const timeNames = /^(time|timestamp|date|datetime|date ?time|date_time|local time|time \(.*\))$/;
const hourNames = /^(hour|hours? of (the )?year|hour_of_year|hoy|hour ?number|hour_number|hour no\.?)$/;
const weightNames = /^(hours|weight|weight ?hours|duration|duration \(h\)|hours \(h\)|stands for)$/;

function norm(name: string): string {
  return name.trim().toLowerCase().replace(/\s+/g, ' ');
}

function find(headers: string[], test: (h: string) => boolean): Column | null {
  const index = headers.findIndex((h) => test(norm(h)));
  return index < 0 ? null : { index, name: headers[index].trim() };
}

function refuse(errors: ProfileRowError[], total: number): never {
  const listed = errors.slice(0, maxListedRowErrors);
  const lines = listed.map((e) =>
    e.row > 0 ? `Row ${e.row}, ${e.column}: ${e.message}` : `${e.column}: ${e.message}`,
  );
  const more = total > listed.length ? ` (${total - listed.length} more not listed)` : '';
  const details = {
    field: 'file',
    fieldErrors: { file: lines },
    rowErrors: listed,
    errorCount: total,
  };
  throw new ApiError(
    422,
    'invalid_profile',
    `file: ${lines[0]}${total > 1 ? ` — ${total} errors${more}` : ''}`,
    details,
  );
}

function temperatureUnit(name: string): 'C' | 'K' | null {
  const n = norm(name);
  if (/°c|degc|deg c|\(c\)|\[c\]|_c$| c$|celsius/.test(n)) return 'C';
  if (/\(k\)|\[k\]|_k$| k$|kelvin/.test(n)) return 'K';
  return null;
}

function humidityUnit(name: string): 'percent' | 'fraction' | null {
  const n = norm(name);
  if (/%|percent|pct/.test(n)) return 'percent';
  if (/fraction|0-1|0–1/.test(n)) return 'fraction';
  return null;
}

function pressureFactor(name: string): number {
  const n = norm(name);
  if (/hpa|mbar/.test(n)) return 0.1;
  if (/kpa/.test(n)) return 1;
  if (/\(pa\)|\[pa\]|_pa$| pa$/.test(n)) return 0.001;
  return 1;
}

function median(values: number[]): number {
  const finite = values.filter(Number.isFinite).sort((a, b) => a - b);
  return finite.length ? finite[finite.length >> 1] : NaN;
}

/** A number in a cell, or NaN (blank or not a number); a decimal comma is not accepted. */
function num(cell: string | undefined): number {
  if (cell === undefined) return NaN;
  const t = cell.trim();
  if (t === '' || !/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t)) return NaN;
  return Number(t);
}

export function parseProfileCsv(bytes: Buffer): ParsedProfile {
  let records: Array<{ record: string[]; info: { lines: number } }>;
  try {
    records = parseCsv(bytes, {
      bom: true,
      info: true,
      skip_empty_lines: true,
      relax_column_count: true,
      trim: true,
      delimiter: [',', ';', '\t'],
    }) as unknown as Array<{ record: string[]; info: { lines: number } }>;
  } catch (error) {
    const e = error as Error & { lines?: number };
    return refuse([{ row: e.lines ?? 0, column: 'file', message: `The file is not readable CSV: ${e.message}` }], 1);
  }
  if (records.length < 2)
    return refuse([{ row: 0, column: 'file', message: 'The file needs a header line and one line per hour.' }], 1);

  const headers = records[0].record;
  const time = find(headers, (h) => timeNames.test(h));
  const hour = time ? null : find(headers, (h) => hourNames.test(h));
  const weight = find(headers, (h) => weightNames.test(h));
  const temperature = find(headers, (h) => /temp|dry ?-?bulb|drybulb|tdb|t_db/.test(h));
  const humidity = find(headers, (h) => /(^|[^a-z])rh([^a-z]|$)|humid/.test(h));
  const pressure = find(headers, (h) => /press|kpa|hpa|mbar/.test(h));

  const missing: ProfileRowError[] = [];
  if (!time && !hour)
    missing.push({ row: 1, column: 'time', message: 'No time or hour column (name one “time” or “hour”).' });
  if (!temperature)
    missing.push({
      row: 1,
      column: 'temperature',
      message: 'No dry-bulb temperature column (a name with “temperature”, e.g. “temperature °C”).',
    });
  if (!humidity)
    missing.push({
      row: 1,
      column: 'relative humidity',
      message: 'No relative humidity column (a name with “RH” or “humidity”, e.g. “RH %”).',
    });
  if (missing.length) return refuse(missing, missing.length);

  const body = records.slice(1);
  const n = body.length;
  const rawT = body.map((r) => num(r.record[temperature!.index]));
  const rawRH = body.map((r) => num(r.record[humidity!.index]));
  const tUnit = temperatureUnit(temperature!.name) ?? (median(rawT) > 150 ? 'K' : 'C');
  const rhUnit = humidityUnit(humidity!.name) ?? (rawRH.some((v) => v > 1.5) ? 'percent' : 'fraction');
  const pFactor = pressure ? pressureFactor(pressure.name) : 1;

  const errors: ProfileRowError[] = [];
  let errorCount = 0;
  const fail = (row: number, column: string, message: string) => {
    errorCount++;
    if (errors.length < maxListedRowErrors) errors.push({ row, column, message });
  };

  const temperatureK: number[] = new Array(n);
  const relativeHumidity: number[] = new Array(n);
  const pressureKPa: number[] | null = pressure ? new Array(n) : null;
  const weightHours: number[] | null = weight ? new Array(n) : null;
  const seen = new Map<number, number>();
  const timeColumn = (time ?? hour)!;
  let hours = 0;
  for (let i = 0; i < n; i++) {
    const { record, info } = body[i];
    const line = info.lines;

    const stamp = record[timeColumn.index]?.trim() ?? '';
    let key: number;
    if (time) {
      key = stamp === '' ? NaN : Date.parse(/[zZ]|[+-]\d\d:?\d\d$/.test(stamp) ? stamp : `${stamp.replace(' ', 'T')}Z`);
      if (!Number.isFinite(key)) fail(line, timeColumn.name, `“${stamp.slice(0, 40)}” is not a date and time.`);
    } else {
      key = num(stamp);
      if (!(Number.isInteger(key) && key >= 0 && key <= 8784)) {
        fail(line, timeColumn.name, `“${stamp.slice(0, 40)}” is not an hour number (a whole number 0–8784).`);
        key = NaN;
      }
    }
    if (Number.isFinite(key)) {
      const first = seen.get(key);
      if (first !== undefined) fail(line, timeColumn.name, `The same hour as row ${first}.`);
      else seen.set(key, line);
    }

    const t = rawT[i];
    const tK = tUnit === 'K' ? t : t + 273.15;
    if (!Number.isFinite(t)) fail(line, temperature!.name, 'Temperature must be a number.');
    else if (tK < profileMinK - 1e-9 || tK > profileMaxK + 1e-9)
      fail(
        line,
        temperature!.name,
        `${t} ${tUnit === 'K' ? 'K' : '°C'} is outside −60 °C to +60 °C (${profileMinK}–${profileMaxK} K).`,
      );
    temperatureK[i] = tK;

    const h = rawRH[i];
    const rh = rhUnit === 'percent' ? h / 100 : h;
    if (!Number.isFinite(h)) fail(line, humidity!.name, 'Relative humidity must be a number.');
    else if (rh < 0 || rh > 1)
      fail(line, humidity!.name, `${h}${rhUnit === 'percent' ? ' %' : ''} is outside 0–100 %.`);
    relativeHumidity[i] = rh;

    if (pressure && pressureKPa) {
      const raw = num(record[pressure.index]);
      const p = raw * pFactor;
      if (!Number.isFinite(raw)) fail(line, pressure.name, 'Pressure must be a number.');
      else if (p < 5 || p > 120) fail(line, pressure.name, `${p} kPa is outside 5–120 kPa.`);
      pressureKPa[i] = p;
    }

    let w = 1;
    if (weight && weightHours) {
      w = num(record[weight.index]);
      if (!(Number.isFinite(w) && w > 0 && w <= 8784)) {
        fail(line, weight.name, 'Hours must be a number above 0 (the hours this row stands for).');
        w = 0;
      }
      weightHours[i] = w;
    }
    hours += w;
  }
  if (errorCount > 0) return refuse(errors, errorCount);

  const rounded = Math.round(hours * 1000) / 1000;
  if (!(yearHours as readonly number[]).includes(rounded)) {
    const message = weight
      ? `The hours column adds up to ${rounded} h; it must add up to 8760 or 8784.`
      : `The file has ${n} rows; it needs one per hour, 8760 or 8784 (or an hours column saying what each row stands for).`;
    return refuse([{ row: 0, column: weight ? weight.name : 'rows', message }], 1);
  }
  return { columns: { temperatureK, relativeHumidity, pressureKPa, weightHours }, rows: n, hours: rounded };
}

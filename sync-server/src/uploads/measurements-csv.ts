/**
 * Measured data as CSV: a header naming model parameters and observables, one row per
 * measurement. A column `X_err` is the uncertainty of observable `X` (may be left empty).
 * Parsed with csv-parse; every problem names its line and column.
 */
import { BadRequestException } from '@nestjs/common';
import { CsvError, parse } from 'csv-parse/sync';

export interface MeasurementRow {
  line: number;
  parameters: Record<string, number>;
  values: Record<string, number>;
  uncertainties: Record<string, number>;
}

export interface MeasurementsSummary {
  parameters: string[];
  observables: { name: string; uncertainty: boolean }[];
  rows: MeasurementRow[];
}

const NAME = /^[A-Za-z_][A-Za-z0-9_.]*$/;

function csvProblem(message: string, line?: number, column?: number, name?: string): BadRequestException {
  const where = line === undefined ? '' : `line ${line}${column === undefined ? '' : `, column ${column}${name ? ` (${name})` : ''}`}: `;
  return new BadRequestException({ message: `The CSV file was refused; nothing was stored: ${where}${message}`, details: [{ line: line ?? null, column: column ?? null, problem: message }] });
}

export function parseMeasurementsCsv(text: string, parameters: string[]): MeasurementsSummary {
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, { info: true, skip_empty_lines: true, trim: true, bom: true, relax_column_count: false }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (error) {
    if (error instanceof CsvError) {
      const e = error as CsvError & { lines?: number; column?: number | string };
      const line = typeof e.lines === 'number' ? e.lines : undefined;
      const text = e.message
        .replace(/^Invalid Record Length: /, '')
        .replace(/ on line \d+$/, '')
        .replace(/^expect (\d+), got (\d+)$/, (_m, want: string, got: string) => `the row has ${got} fields but the header has ${want}`);
      throw csvProblem(text, line);
    }
    throw error;
  }
  if (records.length === 0) throw csvProblem('the file is empty; it needs a header line and at least one row', 1);
  const header = records[0].record;
  const seen = new Set<string>();
  header.forEach((name, i) => {
    if (!NAME.test(name)) throw csvProblem(`"${name}" is not a column name (letters, digits, _ and . ; starting with a letter)`, records[0].info.lines, i + 1);
    if (seen.has(name)) throw csvProblem(`column "${name}" appears twice`, records[0].info.lines, i + 1);
    seen.add(name);
  });
  for (const p of parameters) if (!seen.has(p)) throw csvProblem(`the header has no column for the model parameter "${p}" (columns: ${header.join(', ')})`, records[0].info.lines);
  const observables = header.filter((n) => !parameters.includes(n) && !n.endsWith('_err'));
  header.forEach((n, i) => {
    if (!n.endsWith('_err')) return;
    const of = n.slice(0, -4);
    if (!observables.includes(of)) throw csvProblem(`"${n}" is an uncertainty column but there is no observable column "${of}"`, records[0].info.lines, i + 1);
  });
  if (observables.length === 0) throw csvProblem('the header names no observable (every column is a parameter or an uncertainty)', records[0].info.lines);
  const rows: MeasurementRow[] = [];
  for (const { record, info } of records.slice(1)) {
    const row: MeasurementRow = { line: info.lines, parameters: {}, values: {}, uncertainties: {} };
    record.forEach((cell, i) => {
      const name = header[i];
      const isErr = name.endsWith('_err');
      if (isErr && cell === '') return;
      const v = Number(cell);
      if (cell === '' || !Number.isFinite(v)) throw csvProblem(`${JSON.stringify(cell)} is not a number`, info.lines, i + 1, name);
      if (isErr && v < 0) throw csvProblem(`an uncertainty must be ≥ 0 (got ${cell})`, info.lines, i + 1, name);
      if (parameters.includes(name)) row.parameters[name] = v;
      else if (isErr) row.uncertainties[name.slice(0, -4)] = v;
      else row.values[name] = v;
    });
    rows.push(row);
  }
  if (rows.length === 0) throw csvProblem('the file has a header but no rows', records[0].info.lines);
  return { parameters, observables: observables.map((name) => ({ name, uncertainty: header.includes(`${name}_err`) })), rows };
}

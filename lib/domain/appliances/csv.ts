import { CsvError, parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import {
  APPLIANCE_CSV_HEADER,
  applianceFields,
  applianceInputSchema,
  MAX_APPLIANCE_MODELS,
  type ApplianceField,
  type ApplianceModelValues,
} from '@/lib/domain/appliances/model';

/*
 * The appliance library's CSV: RFC 4180 text (comma separated, double quotes around a cell holding a comma,
 * a quote or a line break), a header row naming the columns of APPLIANCE_CSV_HEADER in any order (the
 * required ones must be there), one model per row. Empty cells are "not given". Lengths are inches or text
 * with units ("686 mm"), areas square inches.
 */

export interface CsvRowError {
  /** 1-based line of the file the row ends on (the header is line 1). */
  line: number;
  /** 1-based column number, when the error is about one cell. */
  column: number | null;
  /** The column's header name, when known. */
  columnName: string | null;
  message: string;
}

export type CsvParseResult = { ok: true; rows: Array<ApplianceModelValues & { line: number }> } | { ok: false; errors: CsvRowError[] };

/** Errors listed for one file at most: enough to fix a file, without a huge answer for a broken one. */
const MAX_REPORTED_ERRORS = 50;

const byColumn = new Map<string, ApplianceField>((applianceFields as readonly ApplianceField[]).map((f) => [f.column, f]));
const byKey = new Map<string, ApplianceField>((applianceFields as readonly ApplianceField[]).map((f) => [f.key, f]));

// A cell a spreadsheet would run as a formula is written with a leading apostrophe, and read back without it.
const FORMULA_START = /^[=+\-@]/;

function cellValue(field: ApplianceField, text: string): unknown {
  if (field.kind === 'text' && text.startsWith("'") && FORMULA_START.test(text.slice(1))) return text.slice(1);
  if (field.kind === 'number' || field.kind === 'integer') {
    // Left as text when it is not a number, so the schema names the column in its error.
    const n = Number(text);
    return Number.isFinite(n) ? n : text;
  }
  return text;
}

/** Reads a CSV file of models. Either every row is valid, or the errors say where (line and column). */
export function parseApplianceCsv(text: string): CsvParseResult {
  let records: Array<{ record: string[]; info: { lines: number } }>;
  try {
    records = parse(text, { bom: true, info: true, relax_column_count: true, skip_empty_lines: true, trim: true, to: MAX_APPLIANCE_MODELS + 2 }) as never;
  } catch (err) {
    if (err instanceof CsvError) {
      const at = err as CsvError & { lines?: number; column?: number | string };
      return { ok: false, errors: [{ line: at.lines ?? 1, column: null, columnName: null, message: `Not readable as CSV: ${err.message.replace(/^[A-Za-z ]+: /, '')}` }] };
    }
    throw err;
  }
  if (records.length === 0) return { ok: false, errors: [{ line: 1, column: null, columnName: null, message: `The file is empty; the first line is the header: ${APPLIANCE_CSV_HEADER.join(',')}` }] };

  const [head, ...body] = records;
  const header = head.record.map((h) => h.trim().toLowerCase());
  const errors: CsvRowError[] = [];
  header.forEach((name, i) => {
    if (!byColumn.has(name)) errors.push({ line: head.info.lines, column: i + 1, columnName: name, message: `Unknown column "${name}"; the columns are ${APPLIANCE_CSV_HEADER.join(', ')}.` });
    else if (header.indexOf(name) !== i) errors.push({ line: head.info.lines, column: i + 1, columnName: name, message: `Column "${name}" appears twice.` });
  });
  for (const f of applianceFields as readonly ApplianceField[]) {
    if (f.required && !header.includes(f.column)) errors.push({ line: head.info.lines, column: null, columnName: f.column, message: `The header lacks the required column "${f.column}".` });
  }
  if (errors.length) return { ok: false, errors };
  if (body.length > MAX_APPLIANCE_MODELS) {
    return { ok: false, errors: [{ line: body[MAX_APPLIANCE_MODELS].info.lines, column: null, columnName: null, message: `At most ${MAX_APPLIANCE_MODELS} models in one file.` }] };
  }

  const rows: Array<ApplianceModelValues & { line: number }> = [];
  const seen = new Map<string, number>();
  for (const { record, info } of body) {
    if (errors.length >= MAX_REPORTED_ERRORS) break;
    const line = info.lines;
    if (record.length > header.length) {
      errors.push({ line, column: header.length + 1, columnName: null, message: `This row has ${record.length} cells; the header has ${header.length}.` });
      continue;
    }
    const input: Record<string, unknown> = {};
    header.forEach((name, i) => {
      const text = (record[i] ?? '').trim();
      if (text !== '') input[byColumn.get(name)!.key] = cellValue(byColumn.get(name)!, text);
    });
    const parsed = applianceInputSchema.safeParse(input);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const field = byKey.get(String(issue.path[0] ?? ''));
        const column = field ? header.indexOf(field.column) : -1;
        errors.push({
          line,
          column: column >= 0 ? column + 1 : null,
          columnName: field?.column ?? null,
          message: issue.message,
        });
      }
      continue;
    }
    const key = `${parsed.data.kind}\u0000${parsed.data.label.toLowerCase()}`;
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      errors.push({ line, column: header.indexOf('label') + 1, columnName: 'label', message: `The ${parsed.data.kind} "${parsed.data.label}" is already on line ${earlier}.` });
      continue;
    }
    seen.set(key, line);
    rows.push({ ...parsed.data, line });
  }
  return errors.length ? { ok: false, errors: errors.slice(0, MAX_REPORTED_ERRORS) } : { ok: true, rows };
}

/** Writes models as CSV with the documented header; numbers in inches, square inches, cfm, V and A. */
export function serializeApplianceCsv(models: readonly ApplianceModelValues[]): string {
  const rows = models.map((m) => (applianceFields as readonly ApplianceField[]).map((f) => {
    const v = (m as unknown as Record<string, unknown>)[f.key];
    if (v === null || v === undefined) return '';
    if (typeof v === 'number') return String(Number(v.toPrecision(12)));
    return FORMULA_START.test(String(v)) ? `'${String(v)}` : String(v);
  }));
  return stringify([APPLIANCE_CSV_HEADER as string[], ...rows], { record_delimiter: '\r\n' });
}

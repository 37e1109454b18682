// Input errors of the ingest layer: one class, stable codes, one-line messages, exit codes.
// A data problem that leaves the file usable is never thrown (rows are skipped and counted instead);
// only a file that cannot be analysed at all, or a setting that cannot work, throws an InputError.
// The table of codes lives in src/ingest/ERRORS.md (copied into docs/manual.md).

/** Stable error codes. Never rename one: scripts and batch manifests match on them. */
export const INPUT_ERROR_CODES = [
  'missing_file',
  'empty_file',
  'header_only',
  'no_numeric_rows',
  'columns_not_found',
  'ambiguous_column',
  'unit_mismatch',
  'time_not_increasing',
  'rate_too_low',
  'not_text',
  'line_too_long',
  'too_many_skipped',
  'read_failed',
  'bad_setting',
  'edf_bad_header',
  'edf_truncated',
  'edf_record_count',
  'wfdb_bad_header',
  'wfdb_truncated',
  'wfdb_unsupported',
  'wfdb_missing_signal_file',
  'wfdb_signal_file',
] as const;

export type InputErrorCode = (typeof INPUT_ERROR_CODES)[number];

/** Process exit codes: usage or settings error 2, unusable input 3, internal error 70 (BSD EX_SOFTWARE). */
export const EXIT_CODES = {
  ok: 0,
  usage: 2,
  input: 3,
  internal: 70,
} as const;

/** Exit code for an error code: `bad_setting` is a usage error (2), everything else unusable input (3). */
export function exitCodeFor(code: string): number {
  if (code === 'bad_setting') return EXIT_CODES.usage;
  if ((INPUT_ERROR_CODES as readonly string[]).includes(code)) return EXIT_CODES.input;
  return EXIT_CODES.internal;
}

export interface InputErrorPlace {
  file?: string;
  /** 1-based line number in the file */
  line?: number;
  /** 1-based column (field) number */
  column?: number;
}

/**
 * A file or setting that cannot be used. `message` is one line:
 * `FILE line L column C: WHAT. HINT` (parts that do not apply are left out).
 * @example new InputError('columns_not_found', 'no column looks like CO2 (header: time;Paw;Flow)',
 *   'Give --co2-col NAME.', { file: 'recording.csv', line: 1 }).message
 *   // => 'recording.csv line 1: no column looks like CO2 (header: time;Paw;Flow). Give --co2-col NAME.'
 */
export class InputError extends Error {
  code: string;
  file?: string;
  line?: number;
  column?: number;
  hint: string;
  /** the problem without place and hint */
  detail: string;

  constructor(code: InputErrorCode, detail: string, hint: string, place: InputErrorPlace = {}) {
    super(formatInputMessage(detail, hint, place));
    this.name = 'InputError';
    this.code = code;
    this.detail = detail;
    this.hint = hint;
    if (place.file !== undefined) this.file = place.file;
    if (place.line !== undefined) this.line = place.line;
    if (place.column !== undefined) this.column = place.column;
  }
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof InputError;
}

function formatInputMessage(detail: string, hint: string, place: InputErrorPlace): string {
  const where: string[] = [];
  if (place.file) where.push(place.file);
  if (place.line !== undefined) where.push(`line ${place.line}`);
  if (place.column !== undefined) where.push(`column ${place.column}`);
  const head = where.length ? `${where.join(' ')}: ` : '';
  const oneLine = (s: string) => s.replace(/[\r\n]+/g, ' ').trim();
  const d = oneLine(detail).replace(/\.$/, '');
  const h = oneLine(hint);
  return `${head}${d}.${h ? ' ' + h : ''}`;
}

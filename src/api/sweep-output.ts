/**
 * The sweep's output: the columnar JSON document (pure ASCII, built in blocks, numbers in their
 * shortest round-trip form, null for NaN) and CSV in chunks of rows, with a header naming each column
 * and its unit.
 */
import { bodyEcho, service } from './responses.js';
import type { PreparedSweep, SweepColumns } from './sweep.js';

/** Rows per CSV chunk. */
const CSV_ROWS_PER_CHUNK = 4096;

// ---------------------------------------------------------------------------------------------------
// Output

/** Values per block when numbers are written to text (a few hundred kB of text per block). */
const BLOCK = 8192;

/**
 * The JSON texts of `values[start..end)`, comma-separated without brackets: JSON.stringify over a
 * plain array (reused between blocks) writes each double in its shortest round-trip form, NaN as null,
 * and is about twice as fast in V8 as String(x) per number. -0 is written as 0 (as in JSON.stringify).
 */
function jsonBlock(values: Float64Array, start: number, end: number, scratch: number[]): string {
  if (scratch.length !== end - start) scratch.length = end - start;
  for (let i = start; i < end; i++) scratch[i - start] = values[i]!;
  const s = JSON.stringify(scratch);
  return s.slice(1, -1);
}

/** Appends the JSON array text of `values` to `parts`, block by block (no giant intermediate array). */
function pushArray(parts: string[], values: Float64Array): void {
  parts.push('[');
  const scratch: number[] = [];
  for (let start = 0; start < values.length; start += BLOCK) {
    const block = jsonBlock(values, start, Math.min(values.length, start + BLOCK), scratch);
    parts.push(start === 0 ? block : ',' + block);
  }
  parts.push(']');
}

/** Counts, per reason, the null points of a column, with the first (flat) index of each. */
function nullReasons(codes: Uint8Array, texts: readonly string[]): { reason: string; count: number; firstIndex: number }[] {
  const count = new Float64Array(256);
  const firstIndex = new Float64Array(256).fill(-1);
  for (let i = 0; i < codes.length; i++) {
    const c = codes[i]!;
    if (c !== 0) {
      if (count[c] === 0) firstIndex[c] = i;
      count[c]!++;
    }
  }
  const out: { reason: string; count: number; firstIndex: number }[] = [];
  for (let c = 1; c < 256; c++) if (count[c]! > 0) out.push({ reason: texts[c]!, count: count[c]!, firstIndex: firstIndex[c]! });
  return out.sort((x, y) => x.firstIndex - y.firstIndex);
}

/**
 * JSON.stringify with every character outside ASCII written as a \uXXXX escape (the same JSON value).
 * The sweep document is then pure ASCII, so V8 holds its one large string in one byte per character
 * (a single π in a reason or note would otherwise make the whole document two bytes per character),
 * and the route can send it as a Buffer copied byte for byte (latin1) instead of encoding it to UTF-8
 * on every response.
 */
function asciiJson(value: unknown): string {
  return JSON.stringify(value).replace(/[\u007f-\uffff]/g, (ch) => `\\u${ch.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/**
 * The columnar JSON document (sweepResponse) as text pieces, written directly from the typed arrays
 * (blocks of BLOCK numbers), pure ASCII (asciiJson): stream them, or join them (sweepJson).
 */
export function* sweepJsonChunks(prepared: PreparedSweep, columns: SweepColumns): Generator<string> {
  let parts: string[] = [];
  parts.push(`{"service":${asciiJson(service)},"body":${asciiJson(bodyEcho(prepared.body))},"axes":[`);
  for (const [k, ax] of prepared.axes.entries()) {
    parts.push(`${k ? ',' : ''}{"variable":${asciiJson(ax.variable)},"unit":${asciiJson(ax.unit)},"values":`);
    pushArray(parts, ax.values);
    parts.push('}');
    yield* parts;
    parts = [];
  }
  parts.push(`],"shape":${asciiJson(prepared.shape)},"columns":{`);
  for (const [k, col] of columns.columns.entries()) {
    parts.push(`${k ? ',' : ''}${asciiJson(col.info.name)}:{"unit":${asciiJson(col.info.unit)},"values":`);
    pushArray(parts, col.values);
    parts.push(`,"nullReasons":${asciiJson(nullReasons(col.codes, columns.reasons))}}`);
    yield* parts;
    parts = [];
  }
  yield `},"notes":${asciiJson(prepared.notes)}}`;
}

/** The columnar JSON document (sweepResponse) as one string. */
export function sweepJson(prepared: PreparedSweep, columns: SweepColumns): string {
  return [...sweepJsonChunks(prepared, columns)].join('');
}

/** CSV field for a header name: quoted only if it needs it (RFC 4180). */
function csvField(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * The CSV text in chunks of CSV_ROWS_PER_CHUNK rows: a header naming each column with its unit
 * ("r [m],flowSpeed [m/s]"), then one row per grid point (row-major), axis values first; an empty
 * field where a quantity does not exist. Lines end in CRLF (RFC 4180).
 */
export function* sweepCsvChunks(prepared: PreparedSweep, columns: SweepColumns): Generator<string> {
  const names = [
    ...prepared.axes.map((a) => `${a.variable} [${a.unit}]`),
    ...columns.columns.map((c) => `${c.info.name} [${c.info.unit}]`),
  ];
  yield names.map(csvField).join(',') + '\r\n';
  const { n, shape } = prepared;
  const n2 = shape.length === 2 ? shape[1]! : 1;
  const a0 = prepared.axes[0]!.values;
  const a1 = prepared.axes[1]?.values;
  const scratch: number[] = [];
  // Axis values per row, then the columns: each block of every column is written once with
  // JSON.stringify and split, then interleaved row by row; "null" becomes an empty field.
  const axisRows = new Float64Array(CSV_ROWS_PER_CHUNK);
  const axisRows2 = new Float64Array(CSV_ROWS_PER_CHUNK);
  for (let start = 0; start < n; start += CSV_ROWS_PER_CHUNK) {
    const end = Math.min(n, start + CSV_ROWS_PER_CHUNK);
    const len = end - start;
    for (let i = start; i < end; i++) {
      axisRows[i - start] = a1 ? a0[Math.floor(i / n2)]! : a0[i]!;
      if (a1) axisRows2[i - start] = a1[i % n2]!;
    }
    const fields: string[][] = [jsonBlock(axisRows, 0, len, scratch).split(',')];
    if (a1) fields.push(jsonBlock(axisRows2, 0, len, scratch).split(','));
    for (const c of columns.columns) fields.push(jsonBlock(c.values, start, end, scratch).split(','));
    const rows = new Array<string>(len);
    for (let i = 0; i < len; i++) {
      let row = fields[0]![i]!;
      for (let k = 1; k < fields.length; k++) {
        const x = fields[k]![i]!;
        row += x === 'null' ? ',' : ',' + x;
      }
      rows[i] = row;
    }
    yield rows.join('\r\n') + '\r\n';
  }
}

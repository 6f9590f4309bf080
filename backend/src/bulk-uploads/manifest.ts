import { parse } from 'csv-parse/sync';
import {
  BULK_MANIFEST_COLUMNS,
  BULK_MANIFEST_REQUIRED_COLUMNS,
  type BulkManifestColumn,
} from '@gyre/shared';
import { GyreException } from '../common/errors/gyre.exception';
import { BulkUploadsError, bulkUploadsError } from './bulk-uploads.errors';
import { errorMessage } from '../common/errors/error-message';

/** One data row of a manifest: its 1-based number and its cells (trimmed, '' when empty). */
export interface ManifestRow {
  row: number;
  cells: Record<BulkManifestColumn, string>;
}

/**
 * Reads a bulk-upload manifest with csv-parse (RFC 4180: quoted fields, doubled quotes, CRLF or
 * LF, a UTF-8 byte-order mark). The header names the columns (any order, any case); a missing
 * required column, an unknown one, a row with another number of fields or more rows than
 * `maxRows` is refused as a whole, naming the line or the limit.
 */
export function parseManifest(bytes: Buffer, maxRows: number): ManifestRow[] {
  let records: string[][];
  try {
    records = parse(bytes, {
      bom: true,
      trim: true,
      skip_empty_lines: true,
      relax_column_count: false,
    }) as string[][];
  } catch (error) {
    throw invalid(`manifest: ${errorMessage(error)}; a CSV file (RFC 4180) expected`);
  }
  if (records.length === 0)
    throw invalid('manifest: an empty file found, a header and rows expected');
  const header = records[0].map((name) => name.toLowerCase());
  const known = BULK_MANIFEST_COLUMNS as readonly string[];
  const unknown = header.filter((name) => !known.includes(name));
  if (unknown.length > 0) {
    throw invalid(
      `manifest: column ${unknown.map((c) => `'${c}'`).join(', ')} found, only ${BULK_MANIFEST_COLUMNS.join(', ')} expected`,
    );
  }
  const missing = BULK_MANIFEST_REQUIRED_COLUMNS.filter((name) => !header.includes(name));
  if (missing.length > 0) {
    throw invalid(
      `manifest: column ${missing.join(', ')} missing; the header must name ${BULK_MANIFEST_REQUIRED_COLUMNS.join(', ')}`,
    );
  }
  const repeated = header.filter((name, i) => header.indexOf(name) !== i);
  if (repeated.length > 0) throw invalid(`manifest: column '${repeated[0]}' found twice`);
  const rows = records.slice(1);
  if (rows.length === 0)
    throw invalid('manifest: a header without rows found, at least one row expected');
  if (rows.length > maxRows) {
    throw bulkUploadsError(
      BulkUploadsError.TooManyRows,
      `manifest: ${rows.length} rows found, at most ${maxRows} accepted in one bulk upload (BULK_UPLOAD_MAX_ROWS)`,
      { rows: rows.length, limit: maxRows, setting: 'BULK_UPLOAD_MAX_ROWS' },
    );
  }
  return rows.map((fields, index) => {
    const cells = Object.fromEntries(BULK_MANIFEST_COLUMNS.map((c) => [c, ''])) as Record<
      BulkManifestColumn,
      string
    >;
    header.forEach((name, i) => {
      cells[name as BulkManifestColumn] = fields[i] ?? '';
    });
    return { row: index + 1, cells };
  });
}

function invalid(message: string): GyreException {
  return bulkUploadsError(BulkUploadsError.ManifestInvalid, message);
}

/**
 * Recognises files that are not what their name says by their first bytes (magic numbers), so that a spreadsheet
 * or an archive renamed .csv, or a shapefile renamed .geojson, is refused with what it is and what to export.
 * Signatures: ZIP local file header "PK\x03\x04" (APPNOTE.TXT, section 4.3.7), Office Open XML workbooks are ZIP
 * archives holding "xl/" parts (ECMA-376 Part 2); the OLE2 compound file header D0 CF 11 E0 A1 B1 1A E1 (legacy
 * .xls); the shapefile main file code 9994 big-endian (ESRI Shapefile Technical Description, 1998, table 1);
 * gzip 1F 8B (RFC 1952); PDF "%PDF-". GeoPackage (SQLite) files are read, not refused: see geopackage/.
 */
import { inputError } from '../errors.js';
import type { InputFile } from './input-file-type.js';

const EXPORT_TEXT = 'export the points as CSV (UTF-8, with a header row) or GeoJSON, or the layer as a GeoPackage (also accepted)';

function startsWith(bytes: Uint8Array, signature: readonly number[]): boolean {
  return bytes.length >= signature.length && signature.every((value, k) => bytes[k] === value);
}

function asciiOf(bytes: Uint8Array, length: number): string {
  let text = '';
  for (let k = 0; k < Math.min(length, bytes.length); k += 1) text += String.fromCharCode(bytes[k]);
  return text;
}

/**
 * Names of the entries of a ZIP archive, read from its local file headers (APPNOTE.TXT 4.3.7: name length at
 * offset 26, extra length at 28, compressed size at 18); stops at the first entry whose size is deferred.
 */
function zipEntryNames(bytes: Uint8Array): string[] {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const names: string[] = [];
  let offset = 0;
  while (names.length < 1000 && offset + 30 <= bytes.length && view.getUint32(offset, true) === 0x04034b50) {
    const flags = view.getUint16(offset + 6, true);
    const size = view.getUint32(offset + 18, true);
    const nameLength = view.getUint16(offset + 26, true);
    const extraLength = view.getUint16(offset + 28, true);
    names.push(asciiOf(bytes.subarray(offset + 30, offset + 30 + nameLength), nameLength));
    if ((flags & 8) !== 0) break;
    offset += 30 + nameLength + extraLength + size;
  }
  return names;
}

/** What a file really is, when its first bytes say it is a known binary format; null for anything else. */
export function foreignFormat(bytes: Uint8Array): { what: string; fix: string } | null {
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04]) || startsWith(bytes, [0x50, 0x4b, 0x05, 0x06])) {
    const entries = zipEntryNames(bytes);
    const names = `${entries.join('\n')}\n${asciiOf(bytes, 65536)}`;
    if (names.includes('xl/')) return { what: 'an Excel workbook (.xlsx)', fix: `in the spreadsheet, save the sheet as CSV (UTF-8); or ${EXPORT_TEXT}` };
    if (names.includes('word/') || names.includes('ppt/') || names.includes('content.xml')) {
      return { what: 'an office document (ZIP container)', fix: EXPORT_TEXT };
    }
    if (entries.some((name) => /\.shp$/i.test(name))) return { what: 'a ZIP archive holding a shapefile', fix: `open the shapefile in a GIS and ${EXPORT_TEXT}` };
    return { what: 'a ZIP archive', fix: `unzip it and give the CSV, GeoJSON or GeoPackage inside; or ${EXPORT_TEXT}` };
  }
  if (startsWith(bytes, [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1])) {
    return { what: 'a legacy Excel workbook (.xls)', fix: `in the spreadsheet, save the sheet as CSV (UTF-8); or ${EXPORT_TEXT}` };
  }
  if (startsWith(bytes, [0x00, 0x00, 0x27, 0x0a])) {
    return { what: 'a shapefile (.shp)', fix: `open it in a GIS and ${EXPORT_TEXT}` };
  }
  if (startsWith(bytes, [0x1f, 0x8b])) return { what: 'a gzip-compressed file', fix: `decompress it first; or ${EXPORT_TEXT}` };
  if (asciiOf(bytes, 5) === '%PDF-') return { what: 'a PDF document', fix: EXPORT_TEXT };
  return null;
}

/** Refuses a file whose first bytes show a format gridshake does not read, naming it and what to export instead. */
export function refuseForeignFormat(file: InputFile): void {
  if (typeof file.content === 'string') return;
  const found = foreignFormat(file.content);
  if (found) throw inputError(`${file.name}: this is ${found.what}, not CSV or GeoJSON; ${found.fix}`);
}

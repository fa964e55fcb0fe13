/**
 * One registry of error codes (shared/error-codes.ts), one HTTP status each: every GS_ERR_ code spelled anywhere in
 * the sources, tests and documents is registered, and wherever a status is written next to a code (a comment such as
 * "429 GS_ERR_QUEUE_FULL" or "(GS_ERR_GRID_TOO_LARGE, 422)", a test's expected body) it is the registry's status.
 * Status meanings: RFC 9110 section 15, 507 from RFC 4918 section 11.5.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ERROR_CODES, UNCODED_RESPONSE, isErrorCode, statusOf } from '../../shared/error-codes.js';
import { GridshakeError } from '../../server/errors.js';
import * as factories from '../../server/errors.js';
import * as securityErrors from '../../server/security/security-errors.js';
import { storageError } from '../../server/store/open-database.js';

const ROOT = join(__dirname, '..', '..');
const FOLDERS = ['server', 'client/src', 'shared', 'workers', 'test', 'bin', 'tools'];
const DOCUMENTS = ['README.md', 'DEVELOPERS.md'];

function filesUnder(folder: string): string[] {
  const out: string[] = [];
  let entries: string[];
  try {
    entries = readdirSync(folder);
  } catch {
    return out;
  }
  for (const name of entries) {
    if (name === 'node_modules' || name.startsWith('.')) continue;
    const path = join(folder, name);
    if (statSync(path).isDirectory()) out.push(...filesUnder(path));
    else if (/\.(ts|cts|mts|js|cjs|mjs|md)$/.test(name)) out.push(path);
  }
  return out;
}

const sources = [...FOLDERS.flatMap((folder) => filesUnder(join(ROOT, folder))), ...DOCUMENTS.map((name) => join(ROOT, name))]
  .filter((path) => !path.endsWith('error-codes.test.ts'))
  .map((path) => ({ path: relative(ROOT, path), text: readFileSync(path, 'utf8') }));

const CODE = /GS_ERR_[A-Z][A-Z_]*[A-Z]/g;

describe('error-code registry', () => {
  it('gives each code one status, a 4xx or 5xx', () => {
    const codes = Object.keys(ERROR_CODES);
    expect(new Set(codes).size).toBe(codes.length);
    for (const code of codes) {
      expect(code).toMatch(/^GS_ERR_[A-Z_]+$/);
      const status = statusOf(code as keyof typeof ERROR_CODES);
      expect(Number.isInteger(status) && status >= 400 && status <= 599, `${code}: ${status}`).toBe(true);
    }
  });

  it('registers every code used anywhere (only the page fallback for an uncoded response is not a server code)', () => {
    const unregistered = new Set<string>();
    let seen = 0;
    for (const { path, text } of sources) {
      for (const [code] of text.matchAll(CODE)) {
        seen += 1;
        if (!isErrorCode(code) && code !== UNCODED_RESPONSE) unregistered.add(`${code} (${path})`);
      }
    }
    expect(seen).toBeGreaterThan(100);
    expect([...unregistered]).toEqual([]);
  });

  it('never writes a status next to a code that differs from the registry', () => {
    // "429 GS_ERR_X", "GS_ERR_X (422)", "(GS_ERR_X, 422)", "'GS_ERR_X', 422", "statusCode: 507, code: 'GS_ERR_X'"
    const patterns = [
      /\b([45]\d\d)\s+(GS_ERR_[A-Z_]+)/g,
      /(GS_ERR_[A-Z_]+)'?,?\s*\(?([45]\d\d)\b/g,
      /statusCode:\s*([45]\d\d),\s*code:\s*'(GS_ERR_[A-Z_]+)'/g,
    ];
    const disagreements: string[] = [];
    let pairs = 0;
    for (const { path, text } of sources) {
      for (const pattern of patterns) {
        for (const match of text.matchAll(pattern)) {
          const [status, code] = /^\d/.test(match[1]!) ? [Number(match[1]), match[2]!] : [Number(match[2]), match[1]!];
          if (!isErrorCode(code)) continue;
          pairs += 1;
          if (statusOf(code) !== status) disagreements.push(`${path}: ${match[0]} (registry: ${statusOf(code)})`);
        }
      }
    }
    expect(pairs).toBeGreaterThan(10);
    expect(disagreements).toEqual([]);
  });

  it('is where the error factories and the request guards take their status from', () => {
    const made: GridshakeError[] = [
      ...Object.entries(factories)
        .filter(([name]) => /^[a-z]\w*Error$/.test(name) && !name.startsWith('is'))
        .map(([, factory]) => (factory as (message: string) => GridshakeError)('m')),
      ...Object.values(securityErrors).map((factory) => factory('m')),
      storageError('m'),
    ];
    expect(made.length).toBeGreaterThan(15);
    for (const error of made) {
      expect(error).toBeInstanceOf(GridshakeError);
      expect(error.statusCode, error.code).toBe(statusOf(error.code));
    }
    // the storage code was 500 at start-up and 507 in the HTTP handler; one status now (507 Insufficient Storage)
    expect(storageError('m').statusCode).toBe(507);
  });
});

/**
 * Imports only run downhill (DEVELOPERS.md, "Architecture"): workers/ imports nothing from server/ or client/;
 * shared/ nothing from server/ or client/; client/ nothing from server/; server/ nothing from client/; and no file
 * imports itself through a chain (no cycles). Every import and export-from counts, type-only ones and dynamic
 * import() included, as the TypeScript compiler's own pre-processor lists them (ts.preProcessFile).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(import.meta.dirname, '../..');
const ROOMS = ['workers', 'shared', 'server', 'client'] as const;
type Room = (typeof ROOMS)[number];

/** What each room may not import from. */
const FORBIDDEN: Record<Room, readonly Room[]> = {
  workers: ['server', 'client'],
  shared: ['server', 'client'],
  server: ['client'],
  client: ['server'],
};

function sourceFiles(folder: string): string[] {
  const files: string[] = [];
  for (const entry of readdirSync(folder)) {
    const path = join(folder, entry);
    if (entry === 'node_modules' || entry === 'dist') continue;
    if (statSync(path).isDirectory()) files.push(...sourceFiles(path));
    else if (/\.(ts|cts|mts)$/.test(entry) && !entry.endsWith('.d.ts')) files.push(path);
  }
  return files;
}

/** file (relative to the repository) -> the repository files it imports (relative specifiers only). */
function importGraph(): Map<string, string[]> {
  const graph = new Map<string, string[]>();
  for (const room of ROOMS) {
    for (const path of sourceFiles(join(ROOT, room))) {
      const { importedFiles } = ts.preProcessFile(readFileSync(path, 'utf8'), true, true);
      const targets = importedFiles
        .map((entry) => entry.fileName)
        .filter((name) => name.startsWith('.'))
        .map((name) => relative(ROOT, resolve(dirname(path), name)).replace(/\.js$/, '.ts').replace(/\.cjs$/, '.cts').replace(/\.mjs$/, '.mts'));
      graph.set(relative(ROOT, path), targets);
    }
  }
  return graph;
}

const roomOf = (file: string): string => file.split(/[\\/]/)[0];

/** Every cycle found by a depth-first search, as the chain of files. */
function cycles(graph: Map<string, string[]>): string[][] {
  const found: string[][] = [];
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const visit = (file: string): void => {
    state.set(file, 'open');
    stack.push(file);
    for (const target of graph.get(file) ?? []) {
      if (state.get(target) === 'open') found.push([...stack.slice(stack.indexOf(target)), target]);
      else if (!state.has(target)) visit(target);
    }
    stack.pop();
    state.set(file, 'done');
  };
  for (const file of graph.keys()) if (!state.has(file)) visit(file);
  return found;
}

describe('import direction', () => {
  const graph = importGraph();

  it('reads the rooms (the check is not vacuous)', () => {
    for (const room of ROOMS) expect([...graph.keys()].some((file) => roomOf(file) === room)).toBe(true);
    expect(graph.get('server/sweeps/placements-csv.ts')).toContain('shared/contracts.ts');
  });

  it('runs downhill: no room imports from a room above it', () => {
    const wrong: string[] = [];
    for (const [file, targets] of graph) {
      const forbidden = FORBIDDEN[roomOf(file) as Room];
      for (const target of targets) if (forbidden.includes(roomOf(target) as Room)) wrong.push(`${file} -> ${target}`);
    }
    expect(wrong).toEqual([]);
  });

  it('has no import cycles', () => {
    expect(cycles(graph).map((cycle) => cycle.join(' -> '))).toEqual([]);
  });
});

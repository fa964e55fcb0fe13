/**
 * The file piscina loads for every worker thread: CommonJS, loading the ES task module (workers/pool-task.js) once
 * with import() (why: esm-task-entry.cts).
 */
import { join } from 'node:path';
import { esmTaskEntry } from './esm-task-entry.cjs';

const poolEntry = esmTaskEntry(join(__dirname, 'pool-task.js'));

export = poolEntry;

/**
 * The file piscina loads for the upload parser's worker thread. CommonJS on purpose, like workers/pool-entry.cts:
 * piscina require()s its task file, and require() of an ES module can abort the process on Node 20
 * (v8::Module::IsGraphAsync). This entry loads the ES task module (dataset-parser-task.js) once with import().
 */
import { join } from 'node:path';
import { esmTaskEntry } from '../../workers/esm-task-entry.cjs';
import { lowerThreadPriority } from '../threads/thread-priority.cjs';

/**
 * Nice increment of the parser thread (server/threads/thread-priority.cts): parsing a 2,000,000-point upload takes
 * seconds of CPU, and the request thread must win every time it wants the CPU meanwhile (weights 1024 : 110).
 */
const PARSER_THREAD_NICE = 10;
lowerThreadPriority(PARSER_THREAD_NICE);

const parserEntry = esmTaskEntry(join(__dirname, 'dataset-parser-task.js'));

export = parserEntry;

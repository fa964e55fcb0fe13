/**
 * The file piscina loads for the upload parser's worker thread. CommonJS on purpose, like workers/pool-entry.cts:
 * piscina require()s its task file, and require() of an ES module can abort the process on Node 20
 * (v8::Module::IsGraphAsync). This entry loads the ES task module (dataset-parser-task.js) once with import().
 */
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

type TaskFunction = (task: unknown) => unknown;

const TASK_MODULE_URL = pathToFileURL(join(__dirname, 'dataset-parser-task.js')).href;
let taskFunction: Promise<TaskFunction> | undefined;

function parserEntry(task: unknown): Promise<unknown> {
  taskFunction ??= import(TASK_MODULE_URL).then((module: { default: TaskFunction }) => module.default);
  return taskFunction.then((run) => run(task));
}

export = parserEntry;

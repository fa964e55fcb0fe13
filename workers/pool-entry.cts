/**
 * The file piscina loads for every worker thread. It is CommonJS on purpose: piscina first loads its task file with
 * require(), and on Node 20.19+ require() of an ES module (our workers/pool-task.js) can abort the whole process with
 * "v8::Module::IsGraphAsync … must be used on an instantiated module". This entry is an ordinary CommonJS module; it
 * loads the ES task module once with import(), which is always safe, and hands each task to it.
 */
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

type TaskFunction = (task: unknown) => unknown;

const TASK_MODULE_URL = pathToFileURL(join(__dirname, 'pool-task.js')).href;
let taskFunction: Promise<TaskFunction> | undefined;

function poolEntry(task: unknown): Promise<unknown> {
  taskFunction ??= import(TASK_MODULE_URL).then((module: { default: TaskFunction }) => module.default);
  return taskFunction.then((run) => run(task));
}

export = poolEntry;

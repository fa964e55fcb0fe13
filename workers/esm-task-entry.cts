/**
 * A piscina task function that loads an ES task module once with import() and hands it every task. The entries that
 * piscina loads are CommonJS on purpose: piscina first loads its task file with require(), and on Node 20.19+
 * require() of an ES module can abort the whole process with "v8::Module::IsGraphAsync … must be used on an
 * instantiated module"; import() from CommonJS is always safe. Used by workers/pool-entry.cts (the engine) and
 * server/services/dataset-parser-entry.cts (the upload parser).
 */
import { pathToFileURL } from 'node:url';

type TaskFunction = (task: unknown) => unknown;

/** The task function of the ES module at `path` (its default export), loaded on the first task. */
export function esmTaskEntry(path: string): (task: unknown) => Promise<unknown> {
  const url = pathToFileURL(path).href;
  let taskFunction: Promise<TaskFunction> | undefined;
  return (task) => {
    taskFunction ??= import(url).then((module: { default: TaskFunction }) => module.default);
    return taskFunction.then((run) => run(task));
  };
}

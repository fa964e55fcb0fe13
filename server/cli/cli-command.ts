/** The shape of one CLI command: its name, help text, options and what it runs. main.ts keeps the table. */
import type { OptionSpecs, OptionValues } from './args.js';

/** Where a command writes: stdout for results, stderr for progress and errors. Tests capture both. */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
}

export interface CliCommand {
  name: string;
  /** one line for `gridshake --help` */
  summary: string;
  /** the usage lines printed first by `gridshake <name> --help` */
  usage: string;
  options: OptionSpecs;
  /** runs with parsed option values; returns the exit code */
  run(values: OptionValues, io: CliIo): Promise<number>;
}

/**
 * The gridshake command line: a table of commands, shared help and error handling.
 * Exit codes: 0 done, 1 a user error (bad input or parameter, message on stderr) or any other failure (one line,
 * see unexpected-error.ts), 2 a bad command line or a plan whose Monte Carlo test could never reject
 * (GS_ERR_TOO_FEW_SIMS, CLI_EXIT_CODES).
 * To add a command, add one line to COMMANDS. Each command's module is loaded only when it runs (or for the
 * overview): `gridshake serve` then never loads the input libraries the other commands need, and starts faster.
 */
import { CLI_EXIT_CODES, isGridshakeError } from '../errors.js';
import { optionHelp, parseOptions, UsageError } from './args.js';
import type { CliCommand, CliIo } from './cli-command.js';
import { unexpectedErrorText } from './unexpected-error.js';

export { unexpectedErrorText };

const COMMANDS: Record<string, () => Promise<CliCommand>> = {
  serve: async () => (await import('./serve-command.js')).serveCommand,
  count: async () => (await import('./count-command.js')).countCommand,
  sweep: async () => (await import('./sweep-command.js')).sweepCommand,
  worker: async () => (await import('./worker-command.js')).workerCommand,
};

function allCommands(): Promise<CliCommand[]> {
  return Promise.all(Object.values(COMMANDS).map((load) => load()));
}

const PROCESS_IO: CliIo = {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
};

function overview(commands: CliCommand[]): string {
  const rows = commands.map((command) => `  ${command.name.padEnd(8)} ${command.summary}`);
  return `Usage: gridshake <command> [options]\n\nCommands:\n${rows.join('\n')}\n\nRun 'gridshake <command> --help' for its options.\n`;
}

function commandHelp(command: CliCommand): string {
  return `${command.usage}\n\nOptions:\n${optionHelp(command.options)}\n`;
}

export async function runCli(argv: string[], io: CliIo = PROCESS_IO): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    (name === undefined ? io.stderr : io.stdout)(overview(await allCommands()));
    return name === undefined ? 2 : 0;
  }
  const load = Object.hasOwn(COMMANDS, name) ? COMMANDS[name] : undefined;
  if (load === undefined) {
    io.stderr(`gridshake: unknown command '${name}'; commands: ${Object.keys(COMMANDS).join(', ')}\n`);
    return 2;
  }
  const command = await load();
  try {
    const values = parseOptions(rest, command.options);
    if (values.help === true) {
      io.stdout(commandHelp(command));
      return 0;
    }
    return await command.run(values, io);
  } catch (error) {
    if (error instanceof UsageError) {
      io.stderr(`gridshake ${command.name}: ${error.message}\nRun 'gridshake ${command.name} --help' for its options.\n`);
      return 2;
    }
    if (isGridshakeError(error)) {
      io.stderr(`gridshake: ${error.cliMessage}\n`);
      return CLI_EXIT_CODES[error.code] ?? 1;
    }
    io.stderr(unexpectedErrorText(error));
    return 1;
  }
}

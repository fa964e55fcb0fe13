/** Waiting for the stop signal of `gridshake serve` and `gridshake worker`. */

/** Resolves with the signal's name on the first SIGINT or SIGTERM (its listeners removed). */
export function untilSignal(): Promise<string> {
  return new Promise((resolve) => {
    const stop = (signal: string): void => {
      process.off('SIGINT', onInt);
      process.off('SIGTERM', onTerm);
      resolve(signal);
    };
    const onInt = (): void => stop('SIGINT');
    const onTerm = (): void => stop('SIGTERM');
    process.on('SIGINT', onInt);
    process.on('SIGTERM', onTerm);
  });
}

// A one-line error for the terminal with its exit code (for inputs other than the recording, e.g. the gas file).
export class CliError extends Error {
  constructor(
    message: string,
    readonly exitCode: number,
  ) {
    super(message);
  }
}

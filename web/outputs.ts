// Output composition lives in the core (src/report/outputs.ts), shared with the CLI.
export * from '../src/report/outputs';

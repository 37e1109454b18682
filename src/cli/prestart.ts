// Imported first by the CLI entry (its module body runs before the other modules load): for `analyse`, the reader
// thread starts now and loads its bundle while this thread loads the rest of the CLI.
import { prestartReader } from '../node/reader-thread.js';

const command = process.argv[2];
if (command === 'analyse' || command === 'analyze') prestartReader();

#!/usr/bin/env node
// Thin launcher: the CLI ships bundled (dist/cli.cjs, built by `npm run build`, which `npm install` runs)
// so that it starts in well under a second.
const { existsSync } = require('node:fs');
const { join } = require('node:path');
const bundle = join(__dirname, '..', 'dist', 'cli.cjs');
if (!existsSync(bundle)) {
  process.stderr.write('phasewise: the CLI is not built yet. Run `npm install` (or `npm run build`) in the project folder first.\n');
  process.exit(70);
}
require(bundle);

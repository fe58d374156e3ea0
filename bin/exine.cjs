#!/usr/bin/env node
'use strict';
// Thin launcher: the program is bundled into dist/bundle/ by `npm install` (scripts/bundle.mjs),
// one CommonJS file per command (exine.cjs answers --help and names that are no command), read
// through code-cache.cjs with V8's code cache. This file is CommonJS too: an ES module entry would
// start Node's ES module loader, a tenth of a short command's time.
const { existsSync } = require('node:fs');
const { join } = require('node:path');

const bundle = join(__dirname, '..', 'dist', 'bundle');
const arg = process.argv[2];
const own = typeof arg === 'string' && /^[a-z]+$/.test(arg) && existsSync(join(bundle, `${arg}.cjs`));
const name = own ? arg : 'exine';
if (!existsSync(join(bundle, `${name}.cjs`))) {
  process.stderr.write('exine: not built yet; run "npm install" in the exine folder first\n');
  process.exit(1);
}
const loaded = require(join(bundle, 'code-cache.cjs')).load(`${name}.cjs`);

async function run() {
  const args = process.argv.slice(2);
  process.exitCode = await loaded.exports.main(args);
  // The build sets this to make a command's cache. Otherwise a cache that is missing or that this
  // Node refused is made after a run that did its work (not --help), so that the next start has it;
  // a folder exine may not write to keeps it as it is.
  const wanted = process.env.EXINE_WRITE_CODE_CACHE === '1' || (loaded.codeCache !== 'used' && process.exitCode === 0 && !args.includes('--help'));
  if (wanted) {
    try {
      loaded.writeCodeCache();
    } catch {
      // Only a cache: the next start compiles from source again.
    }
  }
}
run();

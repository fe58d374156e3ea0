#!/usr/bin/env node
'use strict';
// Thin launcher: the program is bundled into dist/bundle/ by `npm install` (scripts/bundle.mjs),
// one bundle per command; exine answers --help and names that are no command. A command without a
// screen is CommonJS (NAME.cjs), read through code-cache.cjs; the others are ES modules (NAME.js).
// This file is CommonJS too: an ES module entry would start Node's ES module loader, a tenth of
// a short command's time.
const { existsSync } = require('node:fs');
const { join } = require('node:path');
const { pathToFileURL } = require('node:url');

const bundle = join(__dirname, '..', 'dist', 'bundle');
const built = (file) => existsSync(join(bundle, file));
const arg = process.argv[2];
const own = typeof arg === 'string' && /^[a-z]+$/.test(arg) && (built(`${arg}.cjs`) || built(`${arg}.js`));
const name = own ? arg : 'exine';

async function run() {
  let cached = null;
  let main;
  if (built(`${name}.cjs`)) {
    cached = require(join(bundle, 'code-cache.cjs')).load(`${name}.cjs`);
    ({ main } = cached.exports);
  } else if (built(`${name}.js`)) {
    ({ main } = await import(pathToFileURL(join(bundle, `${name}.js`)).href));
  } else {
    process.stderr.write('exine: not built yet; run "npm install" in the exine folder first\n');
    process.exit(1);
  }
  process.exitCode = await main(process.argv.slice(2));
  // The build runs each CommonJS command once with this set, to make its code cache.
  if (cached && process.env.EXINE_WRITE_CODE_CACHE === '1') cached.writeCodeCache();
}
run();

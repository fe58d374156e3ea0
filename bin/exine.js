#!/usr/bin/env node
// Thin launcher: the program is bundled into dist/bundle/ by `npm install` (scripts/bundle.mjs),
// one bundle per command; exine.js answers --help and names that are no command.
import { existsSync } from 'node:fs';

const name = process.argv[2];
const own = typeof name === 'string' && /^[a-z]+$/.test(name) && existsSync(new URL(`../dist/bundle/${name}.js`, import.meta.url));
const file = `../dist/bundle/${own ? name : 'exine'}.js`;
let main;
try {
  ({ main } = await import(file));
} catch (error) {
  if (error && error.code === 'ERR_MODULE_NOT_FOUND' && String(error.message).includes('dist/bundle/')) {
    process.stderr.write('exine: not built yet; run "npm install" in the exine folder first\n');
    process.exit(1);
  }
  throw error;
}
process.exitCode = await main(process.argv.slice(2));

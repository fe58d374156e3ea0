#!/usr/bin/env node
// Thin launcher: the program is bundled into dist/bundle/ by `npm install` (scripts/bundle.mjs).
let main;
try {
  ({ main } = await import('../dist/bundle/exine.js'));
} catch (error) {
  if (error && error.code === 'ERR_MODULE_NOT_FOUND' && String(error.message).includes('dist/bundle/exine.js')) {
    process.stderr.write('exine: not built yet; run "npm install" in the exine folder first\n');
    process.exit(1);
  }
  throw error;
}
process.exitCode = await main(process.argv.slice(2));

#!/usr/bin/env node
// Thin launcher: the program is built into dist/ by `npm install`.
let main;
try {
  ({ main } = await import('../dist/cli/main.js'));
} catch (error) {
  if (error && error.code === 'ERR_MODULE_NOT_FOUND' && String(error.message).includes('dist/cli/main.js')) {
    process.stderr.write('exine: not built yet; run "npm install" in the exine folder first\n');
    process.exit(1);
  }
  throw error;
}
process.exitCode = await main(process.argv.slice(2));

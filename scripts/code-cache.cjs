'use strict';
// Copied into dist/bundle/ by scripts/bundle.mjs. Loads a CommonJS file of the bundle (one beside
// this one) compiled with the V8 code cache beside it (NAME.cache), made at install by the Node that
// installed exine. Another Node or V8 refuses the cache, and the file is compiled from its source as
// require() would compile it: the same code runs either way, only slower.
const { readFileSync, renameSync, writeFileSync } = require('node:fs');
const { join } = require('node:path');
const { Script } = require('node:vm');

const loaded = new Map();

function load(name) {
  let entry = loaded.get(name);
  if (entry) return entry;
  const file = join(__dirname, name);
  const cacheFile = `${file}.cache`;
  let cachedData;
  try {
    cachedData = readFileSync(cacheFile);
  } catch {
    cachedData = undefined;
  }
  const script = new Script(`(function (exports, require, module, __filename, __dirname) {${readFileSync(file, 'utf8')}\n})`, { filename: file, cachedData });
  const m = { exports: {} };
  script.runInThisContext().call(m.exports, m.exports, require, m, file, __dirname);
  entry = {
    exports: m.exports,
    codeCache: cachedData === undefined ? 'none' : script.cachedDataRejected ? 'refused' : 'used',
    // After the code has run, so that the functions it called are in the cache too.
    writeCodeCache() {
      const tmp = `${cacheFile}.${process.pid}`;
      writeFileSync(tmp, script.createCachedData());
      renameSync(tmp, cacheFile);
    },
  };
  loaded.set(name, entry);
  return entry;
}

module.exports = { load };

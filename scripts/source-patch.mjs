// Patches to a dependency's sources, applied while bundling (scripts/bundle.mjs) and nowhere else:
// the bundle holds the patched copy, so neither npm's hoisting nor --ignore-scripts can leave a user
// with the unpatched one. Each patch is a unified diff in patches/; a hunk applies only where its
// old lines occur exactly once, so a changed dependency fails the build instead of being patched
// somewhere else.
import { readFileSync } from 'node:fs';

/** The files of a unified diff, each with its hunks as old and new blocks of lines. */
export function parseUnifiedDiff(text) {
  const files = new Map();
  let hunks = null;
  let hunk = null;
  for (const line of text.split('\n')) {
    if (line.startsWith('--- ')) continue;
    if (line.startsWith('+++ ')) {
      hunks = [];
      files.set(line.slice(4).trim().replace(/^b\//, ''), hunks);
      hunk = null;
    } else if (line.startsWith('@@')) {
      if (!hunks) throw new Error(`a hunk before any "+++" line: ${line}`);
      hunk = { old: [], new: [] };
      hunks.push(hunk);
    } else if (hunk && (line.startsWith(' ') || line.startsWith('-') || line.startsWith('+'))) {
      const body = line.slice(1);
      if (line[0] !== '+') hunk.old.push(body);
      if (line[0] !== '-') hunk.new.push(body);
    } else if (line === '\\ No newline at end of file' || line === '') {
      continue;
    } else {
      throw new Error(`not a line of a unified diff: ${line}`);
    }
  }
  return files;
}

/** The source with every hunk applied; throws, naming the file, when a hunk's old lines are not there exactly once. */
export function applyHunks(source, hunks, file) {
  let out = source;
  hunks.forEach((h, i) => {
    const old = h.old.join('\n');
    const at = out.indexOf(old);
    if (at < 0 || out.indexOf(old, at + 1) >= 0) {
      throw new Error(`${file}: hunk ${i + 1} of its patch ${at < 0 ? 'does not match' : 'matches more than once'}; the installed version differs from the one the patch was made for`);
    }
    out = out.slice(0, at) + h.new.join('\n') + out.slice(at + old.length);
  });
  return out;
}

/**
 * An esbuild plugin that applies patchFile to the files of packageName it names, and checks at the
 * end of a build that each of them was patched if the package was bundled at all.
 */
export function sourcePatch(packageName, patchFile) {
  const files = parseUnifiedDiff(readFileSync(patchFile, 'utf8'));
  const escaped = packageName.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
  const filter = new RegExp(`[\\\\/]node_modules[\\\\/]${escaped}[\\\\/](.+)$`);
  return {
    name: `patch-${packageName}`,
    setup(b) {
      const patched = new Set();
      let bundled = false;
      b.onStart(() => {
        patched.clear();
        bundled = false;
      });
      b.onLoad({ filter: /\.js$/ }, (args) => {
        const m = filter.exec(args.path);
        if (!m) return undefined;
        bundled = true;
        const rel = m[1].replaceAll('\\', '/');
        const hunks = files.get(rel);
        if (!hunks) return undefined;
        patched.add(rel);
        try {
          return { contents: applyHunks(readFileSync(args.path, 'utf8'), hunks, `${packageName}/${rel}`), loader: 'js' };
        } catch (error) {
          return { errors: [{ text: `${patchFile}: ${error.message}` }] };
        }
      });
      b.onEnd((result) => {
        if (!bundled || result.errors.length > 0) return undefined;
        const missed = [...files.keys()].filter((f) => !patched.has(f));
        if (missed.length === 0) return undefined;
        return { errors: [{ text: `${patchFile}: ${missed.map((f) => `${packageName}/${f}`).join(', ')} not in the bundle; the installed version differs from the one the patch was made for` }] };
      });
    },
  };
}

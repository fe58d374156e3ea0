import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { EventEmitter } from 'node:events';
import { build } from 'esbuild';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { applyHunks, parseUnifiedDiff, sourcePatch } from '../../scripts/source-patch.mjs';
import { tempDir } from '../helpers/temp-dir.js';

const ROOT = join(import.meta.dirname, '../..');
const PATCH = join(ROOT, 'patches/ink-6.8.0-frame-caches.patch');

describe('a unified diff applied to a dependency while bundling', () => {
  const diff = ['--- a/x.js', '+++ b/x.js', '@@ -1,3 +1,3 @@', ' one', '-two', '+2', ' three', ''].join('\n');

  it('replaces each hunk where its old lines stand', () => {
    const hunks = parseUnifiedDiff(diff).get('x.js') ?? [];
    expect(applyHunks('zero\none\ntwo\nthree\nfour\n', hunks, 'x.js')).toBe('zero\none\n2\nthree\nfour\n');
  });

  it('refuses, naming the file, a hunk whose old lines are not there or are there twice', () => {
    const hunks = parseUnifiedDiff(diff).get('x.js') ?? [];
    expect(() => applyHunks('one\nTWO\nthree\n', hunks, 'pkg/x.js')).toThrow(/^pkg\/x\.js: hunk 1 of its patch does not match; the installed version differs/);
    expect(() => applyHunks('one\ntwo\nthree\none\ntwo\nthree\n', hunks, 'pkg/x.js')).toThrow(/^pkg\/x\.js: hunk 1 of its patch matches more than once/);
  });

  it('the Ink patch applies to the installed, pinned Ink, every hunk of it', () => {
    const files = parseUnifiedDiff(readFileSync(PATCH, 'utf8'));
    expect([...files.keys()].sort()).toEqual(['build/measure-text.js', 'build/output.js', 'build/render-node-to-output.js']);
    for (const [file, hunks] of files) {
      const source = readFileSync(join(ROOT, 'node_modules/ink', file), 'utf8');
      const patched = applyHunks(source, hunks, file);
      expect(patched, file).not.toBe(source);
      for (const h of hunks) expect(patched, file).toContain(h.new.join('\n'));
    }
  });
});

/** A terminal that keeps the last frame Ink wrote. */
class FrameStdout extends EventEmitter {
  readonly isTTY = false;
  readonly columns = 60;
  readonly rows = 20;
  last = '';
  write(chunk: string): boolean {
    this.last = chunk;
    return true;
  }
}

type Span = { text: string; color?: 'red' | 'cyan'; bold?: boolean };
type InkModule = {
  render: (tree: unknown, options: object) => { rerender: (tree: unknown) => void; unmount: () => void };
  Box: unknown;
  Text: unknown;
  createElement: (type: unknown, props: object | null, ...children: unknown[]) => unknown;
};

/** Ink and React bundled into a temp folder, with the patch or as published. */
async function bundledInk(dir: string, patched: boolean): Promise<InkModule> {
  const entry = join(dir, `entry-${patched}.js`);
  writeFileSync(entry, "export { render, Box, Text } from 'ink';\nexport { createElement } from 'react';\n");
  const outdir = join(dir, patched ? 'patched' : 'published');
  await build({
    entryPoints: [entry],
    nodePaths: [join(ROOT, 'node_modules')],
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    outdir,
    define: { 'process.env.NODE_ENV': '"production"', fetch: 'undefined' },
    external: ['react-devtools-core'],
    banner: { js: "import { createRequire as __r } from 'node:module'; const require = __r(import.meta.url);" },
    plugins: patched ? [sourcePatch('ink', PATCH)] : [],
    logLevel: 'silent',
  });
  const out = join(outdir, `entry-${patched}.js`);
  expect(readFileSync(out, 'utf8').includes('framesCaches')).toBe(patched);
  return (await import(out)) as InkModule;
}

/** Each frame drawn by one Ink, as Ink writes it (debug mode: every render written whole). */
function drawFrames(ink: InkModule, frames: readonly (readonly Span[][])[]): string[] {
  const stdout = new FrameStdout();
  const tree = (lines: readonly Span[][]) =>
    ink.createElement(
      ink.Box,
      { flexDirection: 'column', width: 60 },
      ...lines.map((spans, i) => ink.createElement(ink.Text, { key: i, wrap: 'truncate-end' }, ...spans.map((s, j) => ink.createElement(ink.Text, { key: j, color: s.color, bold: s.bold }, s.text)))),
    );
  const first = frames[0] ?? [];
  const instance = ink.render(tree(first), { stdout, stderr: stdout, debug: true, patchConsole: false, exitOnCtrlC: false });
  const out = [stdout.last];
  for (const frame of frames.slice(1)) {
    instance.rerender(tree(frame));
    out.push(stdout.last);
  }
  instance.unmount();
  return out;
}

// Text as a counting screen draws it: ASCII, the dashes and dots of its tables, braille plots,
// East Asian wide characters (a taxon name can hold any), and colours.
const piece = fc.constantFrom('Quercus', ' 12.3', '–', '·', '±', '⣀⡤⠒', '│', '漢字', 'é', '  ', 'x'.repeat(30));
const span: fc.Arbitrary<Span> = fc.record({ text: fc.array(piece, { minLength: 1, maxLength: 4 }).map((p) => p.join('')), color: fc.constantFrom(undefined, 'red', 'cyan'), bold: fc.boolean() }, { requiredKeys: ['text'] });
const line = fc.array(span, { minLength: 1, maxLength: 3 });

describe('Ink with frame-to-frame caches (patches/ink-6.8.0-frame-caches.patch)', () => {
  it('draws every frame as Ink as published draws it, frame after frame (property)', async () => {
    const dir = tempDir();
    const [patched, published] = await Promise.all([bundledInk(dir, true), bundledInk(dir, false)]);
    // Frames that share lines with the ones before them: what the caches keep.
    const frames = fc.array(fc.array(line, { minLength: 1, maxLength: 8 }), { minLength: 1, maxLength: 6 }).chain((fresh) => fc.constant(fresh.flatMap((f, i) => [f, [...f.slice(1), ...(fresh[i - 1] ?? [])]])));
    fc.assert(
      fc.property(frames, (fs) => {
        expect(drawFrames(patched, fs)).toEqual(drawFrames(published, fs));
      }),
      { numRuns: 60 },
    );
    // Past the caches' bound of 4,096 entries, so that they are emptied and filled again mid-run.
    const many = Array.from({ length: 400 }, (_, f) => Array.from({ length: 15 }, (_, l) => [{ text: `line ${l} of frame ${f % 7 === 0 ? f : f - (f % 7)} – ⣀ ${f * 15 + l}` }]));
    expect(drawFrames(patched, many)).toEqual(drawFrames(published, many));
  });
});

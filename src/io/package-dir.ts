import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

let found: string | undefined;

/**
 * The exine folder (keymaps/, demo-sessions/), found by walking up from this file: the
 * compiled modules (dist/io/) and the bundle users run (dist/bundle/chunks/) sit at different depths.
 */
export function packageDir(): string {
  if (found !== undefined) return found;
  let dir = dirname(fileURLToPath(import.meta.url));
  while (!existsSync(join(dir, 'package.json')) && dirname(dir) !== dir) dir = dirname(dir);
  return (found = dir);
}

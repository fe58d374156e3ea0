import { ExineError } from '../../errors.js';
import type { Io } from '../io.js';

/** The core view (`exine core DIR [--plain|--json]`); a placeholder until the view is built. */
export async function runCoreView(_args: string[], _io: Io): Promise<number> {
  throw new ExineError('exine core: the core view is not in this build yet (exine export DIR writes the core matrix)');
}

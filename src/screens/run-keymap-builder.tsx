import { render } from 'ink';
import { SCREEN_RENDER } from './render-options.js';
import type { BuilderUi } from './keymap-builder-keys.js';
import { KeymapBuilder } from './keymap-builder.js';

/** Run the builder until the analyst ends it; the keymap as it then stands. */
export async function runKeymapBuilder(start: BuilderUi, file: string): Promise<BuilderUi> {
  let result = start;
  const instance = render(<KeymapBuilder start={start} file={file} onDone={(ui) => (result = ui)} />, SCREEN_RENDER);
  await instance.waitUntilExit();
  return result;
}

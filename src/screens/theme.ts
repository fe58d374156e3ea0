/** Colours of the screens in one place. Meaning never rests on colour alone: words carry it too. */
export interface Theme {
  readonly accent: string | undefined;
  readonly dim: boolean;
  readonly warning: string | undefined;
  readonly error: string | undefined;
  readonly ok: string | undefined;
  readonly zero: string | undefined;
}

const COLOURS: Theme = { accent: 'cyan', dim: true, warning: 'yellow', error: 'red', ok: 'green', zero: 'gray' };
const PLAIN: Theme = { accent: undefined, dim: false, warning: undefined, error: undefined, ok: undefined, zero: undefined };

/** NO_COLOR set to any non-empty value turns colour off (Ink does not honour it by itself). */
export function themeFor(env: NodeJS.ProcessEnv = process.env): Theme {
  return env.NO_COLOR ? PLAIN : COLOURS;
}

/**
 * How every screen is rendered. Ctrl-C is a key of exine's own, and console output is not moved
 * above the screen. Ink draws at most maxFps frames a second: at its default of 30, a key typed
 * just after the clock's tick waited up to 33 ms for its frame; at 60 the wait is at most 17 ms,
 * and a frame costs a few milliseconds.
 */
export const SCREEN_RENDER = { exitOnCtrlC: false, patchConsole: false, maxFps: 60 } as const;

/**
 * Ink draws only the final frame when it believes it runs in CI (CI or
 * CONTINUOUS_INTEGRATION set, read once when Ink is imported). A counting
 * screen on a real terminal must draw live even where such a variable is set
 * (some containers and lab images set CI=1), so drop them for this process
 * before Ink loads. Call only after checking that the terminal is interactive.
 */
export function drawLiveOnThisTerminal(env: NodeJS.ProcessEnv = process.env): void {
  delete env.CI;
  delete env.CONTINUOUS_INTEGRATION;
}

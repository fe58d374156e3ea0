import { render } from 'ink';
import { SCREEN_RENDER } from './render-options.js';
import type { AuditOptions } from '../audit/level-audit.js';
import { fileAuditSource } from '../audit/read-audit.js';
import { AuditScreen } from './audit-screen.js';

/** Run the audit screen until the analyst quits. It holds no lock: corrections take one for a moment each. */
export async function runAuditScreen(path: string, options: AuditOptions): Promise<number> {
  const instance = render(<AuditScreen source={fileAuditSource(path, options)} />, SCREEN_RENDER);
  const stop = () => instance.unmount();
  for (const signal of ['SIGINT', 'SIGHUP', 'SIGTERM'] as const) process.once(signal, stop);
  await instance.waitUntilExit();
  return 0;
}

import { keyLabel, type Keymap } from '../keymap/keymap.js';
import type { LevelState } from '../model/level-state.js';
import type { Snapshot } from '../session/counting-session.js';
import type { InputMode } from '../session/input-mode.js';
import { formatDuration } from '../text/durations.js';
import { localClock, localDateTime, zoneOf } from '../text/local-time.js';
import { line, truncated, type Line } from './styled-line.js';
import { stopBanner } from './rules-panel.js';
import { wordWrap } from '../text/word-wrap.js';

/** The level heading and the traverse, sitting and break line. */
export function headingLines(state: LevelState, sittingMs: number, breakMinutes: number | null, breakDue: boolean): Line[] {
  const h = state.header;
  const where = [h.site, h.core].filter(Boolean).join(' ');
  const depth = h.depth === null ? '' : ` · depth ${h.depth}`;
  return [
    truncated(`${where ? `${where} · ` : ''}level ${h.level}${depth} · slide ${state.slide ?? '–'}`, { bold: true, tone: 'accent' }),
    state.finishedAt
      ? truncated(`FINISHED ${localDateTime(state.finishedAt)} · read-only · ${state.traverse === 1 ? '1 traverse' : `${state.traverse} traverses`} · ${state.sitting === 1 ? '1 sitting' : `${state.sitting} sittings`}`, { bold: true, tone: 'warning' })
      : {
      spans: [
        { text: `traverse ${state.traverse}`, bold: true },
        { text: ` · sitting ${state.sitting} since ${localClock(state.sittingStartedAt, false)} ${zoneOf(state.sittingStartedAt)} · ${formatDuration(sittingMs)}` },
        ...(breakDue ? [{ text: ` · time to rest your eyes (${breakMinutes} min)`, bold: true, tone: 'warning' as const }] : []),
      ],
      wrap: 'truncate-end',
    },
  ];
}

/**
 * The stop banner across the screen, drawn from what the file records (the
 * fold's rules-met / rules-unmet), never from a verdict of the screen's own.
 */
export function stopBannerLine(state: LevelState, width: number): Line | null {
  // A finished level opened read-only has nothing more to stop.
  if (!state.rulesMet || state.finishedAt) return null;
  const text = stopBanner(state.lastRulesMet?.sum ?? null);
  return truncated(text.length >= width ? text.slice(0, width) : text + ' '.repeat(width - text.length), { bold: true, inverse: true });
}

function promptOf(mode: InputMode | null): string | null {
  if (mode?.kind === 'note') {
    const on = mode.grain === null ? 'the level' : `#${mode.grain} ${mode.taxon ?? ''}`.trim();
    return `Note on ${on} (Enter saves, Esc cancels, "@x,y" = stage position): ${mode.text}█`;
  }
  if (mode?.kind === 'new-type') return `New type as "name, group" (Enter counts one grain, Esc cancels): ${mode.text}█`;
  return null;
}

/** Lines a text takes when wrapped at word breaks to `width` columns, as the terminal shows it. */
export function wrappedHeight(text: string, width: number): number {
  return wordWrap(text, width).length;
}

/** The status under the panels: read-only reason, a typed line, the last message, or what opening found. */
export function statusArea(snapshot: Snapshot, width: number): { readonly height: number; readonly line: Line } {
  const prompt = promptOf(snapshot.mode);
  const text = snapshot.readOnly
    ? `READ-ONLY: ${snapshot.readOnly}`
    : prompt
      ? `${snapshot.message ? `${snapshot.message.text} · ` : ''}${prompt}`
      : (snapshot.message?.text ?? (snapshot.notice ? `On opening: ${snapshot.notice}` : ' '));
  // The status takes the lines its words wrap to (up to 4), so no message is cut mid-sentence.
  const height = Math.min(4, wrappedHeight(`✗ ${text}`, width));
  // A key that counted nothing flashes: the message in inverse, so it shows at the edge of sight.
  if (!snapshot.readOnly && !prompt && snapshot.message?.tone === 'miss') return { height, line: line(`✗ ${text}`, { tone: 'warning', bold: true, inverse: true }, 'wrap') };
  const tone = snapshot.message?.tone === 'error' || snapshot.readOnly ? 'error' : prompt ? undefined : 'warning';
  return { height, line: line(text, { tone, bold: prompt !== null }, 'wrap') };
}

/** The actions' keys on the last line, in short words below 100 columns. */
export function keysLine(keymap: Keymap, width: number, readOnly = false): Line {
  if (readOnly) return truncated('read-only: no key counts · Ctrl-C quits', { tone: 'dim' });
  const a = keymap.actions;
  const text =
    width >= 100
      ? `${keyLabel(a.undo)} undo · ${keyLabel(a.traverse)} traverse · ${keyLabel(a.note)} note · ${keyLabel(a.newType)} new type · ${keyLabel(a.cf)} cf. · ${keyLabel(a.help)} help · Ctrl-F finish · Ctrl-C quit`
      : `${keyLabel(a.undo).replace('Backspace', 'Bksp')} undo · ${keyLabel(a.traverse)} trav · ${keyLabel(a.note)} note · ${keyLabel(a.newType)} new · ${keyLabel(a.cf)} cf · ${keyLabel(a.help)} help · ^F fin · ^C quit`;
  return truncated(text, { tone: 'dim' });
}

import type { CoreModel } from '../core/core-model.js';
import { oddTexts, suggestionText, yardstickText } from '../core/next-words.js';
import { plural } from '../text/cells.js';
import { visible } from '../text/visible.js';
import { cellText, columnsFor, depthText, headingText, rowFacts, stripBar, stripScale, type RowFacts } from './core-lines.js';
import { titleText } from './core-view.js';

const PLAIN_STRIPS = 6;
const STRIP = 10;

/** `exine core DIR --plain`: every column, every row, then what to count next and the strips. */
export function corePlainText(model: CoreModel): string {
  const cols = columnsFor(Infinity, 0);
  const facts = rowFacts(model);
  const out: string[] = [titleText(model), '', cols.map(headingText).join(' ')];
  model.rows.forEach((r, i) => out.push(cols.map((c) => cellText(c, r, facts[i] as RowFacts).text).join(' ').trimEnd()));
  if (model.rows.length === 0) out.push('no level and no planned depth yet');
  out.push('', suggestionText(model.next), ...oddTexts(model.next), yardstickText(model.next));
  const notes = model.rows.flatMap((r) => {
    const name = r.file ?? depthText(r.depth);
    if (r.integrity?.kind === 'damaged' || r.integrity?.kind === 'torn') return [`${name}: ${r.integrity.message}`];
    return r.outside.length ? [`${name}: keeps its own settings (${r.outside.join(', ')})`] : [];
  });
  if (notes.length) out.push('', ...notes);
  const strips = model.strips.slice(0, PLAIN_STRIPS + model.config.summaryGroups.length);
  if (strips.length) {
    out.push('', `Strips: % of the pollen sum (taxa outside it: of sum + their own), each scaled to its own maximum`);
    out.push(`${' '.repeat(9)}${strips.map((s) => ` ${s.name.slice(0, STRIP).padEnd(STRIP)}`).join('')}`);
    out.push(`${' '.repeat(9)}${strips.map((s) => ` ${`0–${stripScale(s)}%`.padEnd(STRIP)}`).join('')}`);
    model.rows.forEach((r, i) => {
      if (r.shares === null) return;
      out.push(`${depthText(r.depth).padStart(8)} ${strips.map((s) => ` ${stripBar(s.values[i] ?? null, stripScale(s), STRIP)}`).join('')}`);
    });
    out.push(`${plural(model.strips.length, 'strip')} in all; --json has every one`);
  }
  // Names and files come from files a person made: escaped like every text the screens draw.
  return `${out.map(visible).join('\n')}\n`;
}

import type { RuleReport, RuleStatus } from '../rules/evaluate-rules.js';
import type { Concentration } from '../stats/concentration.js';
import { compact, ruleValue } from '../text/numbers.js';
import { fit, right } from '../text/cells.js';
import { line, type Line } from './styled-line.js';

/** A lone target-sum rule is already the sum panel; the rules panel shows anything more. */
export function showsRulesPanel(report: RuleReport): boolean {
  return report.rules.length > 1 || report.rules.some((r) => r.rule !== 'target') || report.minSum !== null;
}

export function rulesPanelHeight(report: RuleReport, conc: Concentration | null): number {
  return (showsRulesPanel(report) ? 1 + report.rules.reduce((n, r) => n + ruleLines(r, 22).length, 0) : 0) + (conc ? 1 : 0);
}

/** "met", "+120" grains still needed, "?" when no estimate can be made yet, "never" when out of reach. */
function need(r: RuleStatus): string {
  if (r.met) return 'met';
  if (r.grainsNeeded === null) return r.note?.startsWith('unreachable') ? 'never' : '?';
  return `+${compact(r.grainsNeeded)}`;
}

const SHORT: Readonly<Record<RuleStatus['rule'], string>> = {
  target: 'sum',
  precision: '±',
  coverage: 'cover',
  plateau: 'no new',
  markers: 'markers',
  'conc-error': 'c.err',
};

/** "cover .987/.98   met": what, now against the goal, and what it still needs, right-aligned. */
export function ruleLine(r: RuleStatus, room: number): string {
  // Wide panels get the full words, but no wider than a glance takes in.
  const width = Math.min(room, 34);
  const wide = width >= 30;
  const label = wide ? r.label : SHORT[r.rule];
  const head = `${label} ${ruleValue(r.rule, r.value)}/${ruleValue(r.rule, r.target)}`;
  const tail = need(r);
  return head.length + 1 + tail.length <= width ? `${head}${right(tail, width - head.length)}` : fit(`${head} ${tail}`, width);
}

/**
 * A rule's lines. The precision rule takes two, so its goal is said in words
 * ("half-width ≤ 4 points") and its scope and value still fit a narrow panel.
 */
export function ruleLines(r: RuleStatus, room: number): string[] {
  if (r.rule !== 'precision') return [ruleLine(r, room)];
  const width = Math.min(room, 34);
  const scope = r.label.replace(/^half-width ≤ \S+ points ?/, '');
  const head = `  ${scope} now ${ruleValue(r.rule, r.value)}`;
  const tail = need(r);
  return [fit(`half-width ≤ ${ruleValue(r.rule, r.target)} points`, width), head.length + 1 + tail.length <= width ? `${head}${right(tail, width - head.length)}` : fit(`${head} ${tail}`, width)];
}

export function concentrationLine(c: Concentration): string {
  const unit = c.unit === 'grains/cm3' ? '/cm³' : '/g';
  if (c.value === null) return `conc. – (no marker yet)`;
  // With no pollen counted the relative error is undefined, not zero.
  const error = c.relativeError === null ? ' ± –' : ` ±${Math.round(100 * c.relativeError)}%`;
  return `conc ${compact(c.value)}${unit}${error}`;
}

/** The rule set's mode, each rule against its goal (in the "ok" tone once met), and the concentration. */
export function rulesLines(report: RuleReport, conc: Concentration | null, width: number): Line[] {
  return [
    ...(showsRulesPanel(report)
      ? [
          line(fit(`Stop if ${report.mode === 'all' ? 'all' : 'any'}${report.minSum ? ` · sum≥${report.minSum}` : ''}`, width), { bold: true }),
          ...report.rules.flatMap((r) => ruleLines(r, width).map((text) => line(fit(text, width), { tone: r.met ? 'ok' : undefined }))),
        ]
      : []),
    ...(conc ? [line(fit(concentrationLine(conc), width))] : []),
  ];
}

/** The stop signal in words, across the screen: the count can stop; the analyst decides. */
export function stopBanner(sumAtMet: number | null): string {
  const at = sumAtMet === null ? '' : ` at pollen sum ${sumAtMet}`;
  return `STOP RULES MET${at} · you may stop: Ctrl-F finishes, or count on`;
}

import { Box, Text } from 'ink';
import { GROUPS } from '../keymap/groups.js';
import type { LevelTable } from '../stats/level-table.js';
import { bar, fit, right } from '../text/cells.js';
import type { Theme } from './theme.js';

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

function shownGroups(table: LevelTable) {
  return GROUPS.filter((g) => table.sumGroups.includes(g) || table.groupTotals[g] > 0);
}

/** Lines the panel takes, so the screen can give the rest to other panels. */
export function sumPanelHeight(table: LevelTable, target: number | null): number {
  if (target === null) return 1 + shownGroups(table).length;
  return 2 + (table.pollenSum >= target ? 1 : 0) + shownGroups(table).length;
}

export function SumPanel({ table, target, theme, width }: { table: LevelTable; target: number | null; theme: Theme; width: number }) {
  const reached = target !== null && table.pollenSum >= target;
  const barWidth = Math.max(6, Math.min(30, width - 7));
  return (
    <Box flexDirection="column" width={width}>
      <Text bold>{target === null ? `Pollen sum ${table.pollenSum}` : `Pollen sum ${table.pollenSum} / ${target}`}</Text>
      {target === null ? null : (
        <Text color={reached ? theme.ok : theme.accent}>
          {`${bar(table.pollenSum / target, barWidth)} ${right(`${Math.floor((100 * table.pollenSum) / target)}%`, 4)}`}
        </Text>
      )}
      {reached ? <Text color={theme.ok} bold>TARGET SUM REACHED</Text> : null}
      {shownGroups(table).map((g) => (
        <Text key={g}>
          {`${fit(capital(g), 14)} ${right(String(table.groupTotals[g]), 5)}${table.sumGroups.includes(g) ? '' : ' *'}`}
        </Text>
      ))}
    </Box>
  );
}

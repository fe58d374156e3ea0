/** Braille cells hold 2 × 4 dots; bit of the dot at (column, row) within a cell. */
const DOT = [
  [0x01, 0x08],
  [0x02, 0x10],
  [0x04, 0x20],
  [0x40, 0x80],
];

export interface PlotSeries {
  /** Points in data units. */
  readonly points: readonly (readonly [number, number])[];
  /** "line": braille dots joined column by column; "marks": a "·" in each cell a point falls in. */
  readonly style: 'line' | 'marks';
}

/**
 * A small plot on `width` × `height` character cells, x from 0 to xMax and y
 * from 0 to yMax. Lines are drawn in braille (2 × 4 dots per cell), marks as "·"
 * where no line passes, so two series stay apart without colour.
 */
export function braillePlot(width: number, height: number, xMax: number, yMax: number, series: readonly PlotSeries[]): string[] {
  const dots = Array.from({ length: height }, () => new Array<number>(width).fill(0));
  const marks = Array.from({ length: height }, () => new Array<boolean>(width).fill(false));
  const dx = (x: number) => Math.min(2 * width - 1, Math.max(0, Math.round((x / Math.max(xMax, 1e-9)) * (2 * width - 1))));
  const dy = (y: number) => Math.min(4 * height - 1, Math.max(0, Math.round((y / Math.max(yMax, 1e-9)) * (4 * height - 1))));
  const set = (px: number, py: number) => {
    const row = height - 1 - Math.floor(py / 4);
    const cell = (dots[row] as number[]);
    cell[Math.floor(px / 2)] = (cell[Math.floor(px / 2)] as number) | ((DOT[3 - (py % 4)] as number[])[px % 2] as number);
  };
  for (const s of series) {
    if (s.style === 'marks') {
      for (const [x, y] of s.points) {
        const px = dx(x);
        const py = dy(y);
        (marks[height - 1 - Math.floor(py / 4)] as boolean[])[Math.floor(px / 2)] = true;
      }
      continue;
    }
    // Join consecutive points: every dot column between them, rising or falling in steps.
    let last: [number, number] | null = null;
    for (const [x, y] of s.points) {
      const px = dx(x);
      const py = dy(y);
      if (last) {
        const [lx, ly] = last;
        for (let cx = lx; cx <= px; cx++) set(cx, ly);
        for (let cy = Math.min(ly, py); cy <= Math.max(ly, py); cy++) set(px, cy);
      } else set(px, py);
      last = [px, py];
    }
  }
  return dots.map((row, r) =>
    row.map((bits, c) => (bits ? String.fromCodePoint(0x2800 + bits) : (marks[r] as boolean[])[c] ? '·' : ' ')).join(''),
  );
}

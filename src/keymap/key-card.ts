import { groupLetters } from './group-labels.js';
import type { GroupDef, GroupRole } from './groups.js';
import { actionOn, keyGrid, type GridKey } from './key-grid.js';
import { ACTION_NAMES, keyLabel, type Keymap } from './keymap.js';

/** Paper in millimetres, landscape. */
export const PAPER = { a4: { w: 297, h: 210 }, letter: { w: 279.4, h: 215.9 } } as const;
export type Paper = keyof typeof PAPER;

/** Monospaced lettering, so that the width of a text is known before a printer sees it. */
export const CARD_FONT = 'DejaVu Sans Mono, Menlo, Consolas, monospace';
/** Advance of one character, in ems, of the fonts above (DejaVu Sans Mono: 1233/2048). */
export const CHAR_EM = 0.602;

const MARGIN = 12;
// Colour-blind-safe hues (the Okabe–Ito set, a common choice for figures), each paired with a shape and a letter.
const COLOURS = ['#0072B2', '#E69F00', '#009E73', '#CC79A7', '#D55E00', '#56B4E9', '#8C6D1F', '#000000'];
const SHAPES = ['circle', 'square', 'triangle', 'diamond', 'hexagon', 'down'] as const;
type Shape = (typeof SHAPES)[number];
/** The role is in the border too: solid in the sum, dashed outside, double for markers, dotted indeterminable. */
const BORDER: Readonly<Record<GroupRole, string>> = { sum: '', outside: ' stroke-dasharray="2.2 1.2"', marker: '', indeterminable: ' stroke-dasharray="0.5 0.9"' };
const ROLE_WORDS: Readonly<Record<GroupRole, string>> = {
  sum: 'in the pollen sum',
  outside: 'outside the sum (% of sum + group)',
  marker: 'exotic marker',
  indeterminable: 'indeterminable',
};

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const n = (v: number) => String(Math.round(v * 100) / 100);
const widthOf = (text: string, size: number) => [...text].length * CHAR_EM * size;

interface Style {
  readonly colour: string;
  readonly shape: Shape;
  readonly letter: string;
  readonly role: GroupRole;
}

function styles(keymap: Keymap): Map<string, Style> {
  const used = keymap.groups.filter((g) => Object.values(keymap.keys).some((b) => b.group === g.name));
  const letters = groupLetters(keymap.groups.map((g) => g.name));
  return new Map(used.map((g: GroupDef, i) => [g.name, { colour: COLOURS[i % COLOURS.length] as string, shape: SHAPES[i % SHAPES.length] as Shape, letter: letters.get(g.name) ?? '?', role: g.role }]));
}

function text(x: number, y: number, size: number, body: string, extra = ''): string {
  return `<text x="${n(x)}" y="${n(y)}" font-size="${n(size)}"${extra}>${esc(body)}</text>`;
}

/** A group's badge: its shape in its colour with its letter inside, centred on (cx, cy). */
function badge(s: Style, cx: number, cy: number, r: number): string {
  const pts = (list: [number, number][]) => list.map(([x, y]) => `${n(cx + x * r)},${n(cy + y * r)}`).join(' ');
  const paint = `fill="${s.colour}" stroke="#000" stroke-width="0.2"`;
  const hex = Array.from({ length: 6 }, (_, i): [number, number] => [Math.cos((Math.PI / 3) * i), Math.sin((Math.PI / 3) * i)]);
  const shape: Record<Shape, string> = {
    circle: `<circle cx="${n(cx)}" cy="${n(cy)}" r="${n(r)}" ${paint}/>`,
    square: `<rect x="${n(cx - r * 0.9)}" y="${n(cy - r * 0.9)}" width="${n(r * 1.8)}" height="${n(r * 1.8)}" ${paint}/>`,
    triangle: `<polygon points="${pts([[0, -1.15], [1.1, 0.8], [-1.1, 0.8]])}" ${paint}/>`,
    diamond: `<polygon points="${pts([[0, -1.2], [1.2, 0], [0, 1.2], [-1.2, 0]])}" ${paint}/>`,
    hexagon: `<polygon points="${pts(hex)}" ${paint}/>`,
    down: `<polygon points="${pts([[0, 1.15], [1.1, -0.8], [-1.1, -0.8]])}" ${paint}/>`,
  };
  const size = r * 1.1;
  const dy = s.shape === 'triangle' ? r * 0.15 : s.shape === 'down' ? -r * 0.2 : 0;
  return `${shape[s.shape]}${text(cx, cy + size * 0.36 + dy, size, s.letter, ' text-anchor="middle" font-weight="bold" fill="#fff"')}`;
}

/** The taxon name broken into at most `lines` lines of `fit` characters; a word too long is cut with "…". */
export function wrapName(name: string, fit: number, lines: number): string[] {
  const out: string[] = [];
  let current = '';
  // A word too long for the key may break after a hyphen ("Potentilla-" "type").
  const words = name.split(/\s+/).filter(Boolean).flatMap((w) => ([...w].length > fit && w.includes('-') ? w.split(/(?<=-)/) : [w]));
  for (const word of words) {
    const w = [...word].length > fit ? `${[...word].slice(0, fit - 1).join('')}…` : word;
    if (!current) current = w;
    else if ([...`${current} ${w}`].length <= fit) current = `${current} ${w}`;
    else {
      out.push(current);
      current = w;
    }
  }
  if (current) out.push(current);
  if (out.length > lines) {
    const kept = out.slice(0, lines);
    const last = kept[lines - 1] as string;
    kept[lines - 1] = [...last].length >= fit ? `${[...last].slice(0, fit - 1).join('')}…` : `${last}…`;
    return kept;
  }
  return out;
}

function keyCap(keymap: Keymap, st: Map<string, Style>, k: GridKey, ox: number, oy: number, u: number, uh: number): string {
  const gap = u * 0.06;
  const x = ox + k.x * u + gap / 2;
  const y = oy + k.y * uh + gap / 2;
  const w = k.w * u - gap;
  const h = k.h * uh - gap;
  const b = keymap.keys[k.key];
  const action = actionOn(keymap, k.key);
  const s = b ? st.get(b.group) : undefined;
  const pad = u * 0.07;
  const labelSize = u * 0.24;
  const label = keyLabel(k.key);
  const labelText = text(x + pad, y + pad + labelSize * 0.8, k.key === ' ' || label.length > 2 ? labelSize * 0.6 : labelSize, label, ' font-weight="bold"');
  if (b && s) {
    const border = `stroke="${s.colour}" stroke-width="${s.role === 'marker' ? 0.9 : 0.5}"${BORDER[s.role]}`;
    const inner = s.role === 'marker' ? `<rect x="${n(x + 0.9)}" y="${n(y + 0.9)}" width="${n(w - 1.8)}" height="${n(h - 1.8)}" rx="1.2" fill="none" stroke="${s.colour}" stroke-width="0.3"/>` : '';
    const r = u * 0.085;
    // A long single word ("Amaranthaceae") gets smaller letters before it is cut.
    const longest = Math.max(...b.taxon.split(/\s+|(?<=-)/).map((x) => [...x].length));
    const size = Math.max(u * 0.095, Math.min(u * 0.13, (w - 2 * pad) / (CHAR_EM * longest)));
    const fit = Math.max(4, Math.floor((w - 2 * pad) / (CHAR_EM * size)));
    // A taxon taken out of a group in the sum says so at the foot of its key.
    const out = b.inSum === false;
    const room = Math.max(1, Math.floor((h - pad * 2 - labelSize * 1.05 - (out ? size * 1.3 : 0)) / (size * 1.15)));
    const lines = wrapName(b.taxon, fit, Math.min(room, 3));
    const firstLine = y + pad + labelSize * 1.05 + size;
    return [
      `<g class="key" data-key="${esc(k.key)}" data-group="${esc(b.group)}">`,
      `<rect x="${n(x)}" y="${n(y)}" width="${n(w)}" height="${n(h)}" rx="2" fill="#fff" ${border}/>`,
      inner,
      labelText,
      badge(s, x + w - pad - r * 1.1, y + pad + r * 1.1, r),
      ...lines.map((l, i) => text(x + pad, firstLine + i * size * 1.15, size, l, ' class="taxon"')),
      out ? text(x + pad, y + h - pad - size * 0.3, size * 0.9, 'not in sum', ' font-style="italic"') : '',
      '</g>',
    ].join('');
  }
  if (action) {
    const size = u * 0.13;
    return `<g class="key" data-key="${esc(k.key)}" data-action="${action}"><rect x="${n(x)}" y="${n(y)}" width="${n(w)}" height="${n(h)}" rx="2" fill="#e6e6e6" stroke="#555" stroke-width="0.4"/>${labelText}${text(x + pad, y + h - pad - size * 0.3, size, action, ' font-style="italic"')}</g>`;
  }
  return `<g class="key" data-key="${esc(k.key)}"><rect x="${n(x)}" y="${n(y)}" width="${n(w)}" height="${n(h)}" rx="2" fill="none" stroke="#bbb" stroke-width="0.3"/>${text(x + pad, y + pad + labelSize * 0.8, labelSize * (label.length > 2 ? 0.6 : 1), label, ' fill="#aaa"')}</g>`;
}

/** A printable key card (SVG, in millimetres): the keyboard or keypad with each key's taxon, and a legend of the groups. */
export function keyCardSvg(keymap: Keymap, paper: Paper = 'a4'): string {
  const page = PAPER[paper];
  const grid = keyGrid(keymap);
  const st = styles(keymap);
  const inner = page.w - 2 * MARGIN;
  const titleSize = 6;
  const top = MARGIN + titleSize + 6;
  const legendRows = st.size + 2 + (grid.offGrid.length ? Math.ceil(grid.offGrid.length / 3) : 0);
  const legendLine = 4.2;
  const side = grid.kind === 'keypad';
  // A keypad is tall and narrow: the legend goes beside it; a keyboard is wide: below it.
  const gridRoomH = side ? page.h - top - MARGIN : page.h - top - MARGIN - legendRows * legendLine - 4;
  const gridRoomW = side ? inner * 0.5 : inner;
  const u = Math.min(gridRoomW / grid.width, gridRoomH / grid.height);
  // Keys may be taller than wide, up to a third, where the page has room: three lines of a long name.
  const uh = Math.min(u * 1.3, gridRoomH / grid.height);
  const parts: string[] = [];
  parts.push(text(MARGIN, MARGIN + titleSize * 0.8, titleSize, keymap.name, ' font-weight="bold"'));
  const sub = `key card · ${keymap.order.length} taxa · pollen sum: ${keymap.sum.join(' + ')}`;
  parts.push(text(MARGIN, MARGIN + titleSize + 3.2, 3, sub, ' fill="#333"'));
  for (const k of grid.keys) parts.push(keyCap(keymap, st, k, MARGIN, top, u, uh));
  const lx = side ? MARGIN + grid.width * u + 8 : MARGIN;
  let ly = side ? top + 4 : top + grid.height * uh + 6;
  const size = 3.2;
  const legend: string[] = [];
  for (const [group, s] of st) {
    legend.push(badge(s, lx + 1.8, ly - 1.1, 1.7));
    const border = `<line x1="${n(lx + 5)}" y1="${n(ly - 1.1)}" x2="${n(lx + 11)}" y2="${n(ly - 1.1)}" stroke="${s.colour}" stroke-width="${s.role === 'marker' ? 0.9 : 0.5}"${BORDER[s.role]}/>`;
    legend.push(border, text(lx + 13, ly, size, `${s.letter}  ${group}: ${ROLE_WORDS[s.role]}`));
    ly += legendLine;
  }
  const actions = ACTION_NAMES.filter((a) => keymap.actions[a] !== null).map((a) => `${a} ${keyLabel(keymap.actions[a])}`);
  ly += 1.5;
  const actionText = `actions: ${actions.join(' · ')} · Ctrl-C saves and quits`;
  const maxChars = Math.floor((page.w - MARGIN - lx) / (CHAR_EM * size));
  for (const l of wrapName(actionText, maxChars, 3)) {
    legend.push(text(lx, ly, size, l, ' fill="#333"'));
    ly += legendLine;
  }
  if (grid.offGrid.length) {
    const also = grid.offGrid.map((k) => `${keyLabel(k)} ${keymap.keys[k]?.taxon ?? ''} (${st.get(keymap.keys[k]?.group ?? '')?.letter ?? '?'})`).join(' · ');
    for (const l of wrapName(`also: ${also}`, maxChars, 4)) {
      legend.push(text(lx, ly, size, l));
      ly += legendLine;
    }
  }
  parts.push(...legend);
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${page.w}mm" height="${page.h}mm" viewBox="0 0 ${page.w} ${page.h}" font-family="${CARD_FONT}">`,
    `<rect x="0" y="0" width="${page.w}" height="${page.h}" fill="#fff"/>`,
    ...parts,
    '</svg>',
    '',
  ].join('\n');
}

export { widthOf as cardTextWidth };

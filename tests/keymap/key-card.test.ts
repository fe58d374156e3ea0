import { Resvg } from '@resvg/resvg-js';
import { DOMParser, type Element } from '@xmldom/xmldom';
import { describe, expect, it } from 'vitest';
import { CHAR_EM, keyCardSvg, PAPER, type Paper } from '../../src/keymap/key-card.js';
import { keymapFromList } from '../../src/keymap/keymap-from-list.js';
import { parseTaxonList } from '../../src/keymap/list-file.js';
import { loadKeymap } from '../../src/keymap/load-keymap.js';
import type { Keymap } from '../../src/keymap/keymap.js';
import { parseKeymap } from '../../src/keymap/parse-keymap.js';

interface Box { x0: number; y0: number; x1: number; y1: number; text: string }

function parseSvg(svg: string) {
  const errors: string[] = [];
  const doc = new DOMParser({ onError: (level, message) => void (level !== 'warning' && errors.push(message)) }).parseFromString(svg, 'image/svg+xml');
  expect(errors).toEqual([]);
  return doc;
}

/** Each text's box from its position, size and length: the card's lettering is monospaced (CHAR_EM ems a character). */
function textBoxes(doc: ReturnType<typeof parseSvg>): Box[] {
  return Array.from(doc.getElementsByTagName('text')).map((t: Element) => {
    const x = Number(t.getAttribute('x'));
    const y = Number(t.getAttribute('y'));
    const size = Number(t.getAttribute('font-size'));
    const text = t.textContent ?? '';
    const w = [...text].length * CHAR_EM * size;
    const anchor = t.getAttribute('text-anchor');
    const x0 = anchor === 'middle' ? x - w / 2 : x;
    return { x0, x1: x0 + w, y0: y - 0.78 * size, y1: y + 0.22 * size, text };
  });
}

const overlap = (a: Box, b: Box) => a.x0 < b.x1 - 1e-6 && b.x0 < a.x1 - 1e-6 && a.y0 < b.y1 - 1e-6 && b.y0 < a.y1 - 1e-6;

function fortyTaxa(): Keymap {
  const names = ['Pinus', 'Betula', 'Alnus', 'Quercus', 'Ulmus', 'Tilia', 'Fraxinus', 'Corylus', 'Salix', 'Calluna', 'Empetrum', 'Vaccinium', 'Poaceae', 'Cyperaceae', 'Plantago lanceolata', 'Rumex acetosa-type', 'Artemisia', 'Filipendula', 'Potentilla-type', 'Ranunculaceae', 'Asteraceae (Lactuceae)', 'Apiaceae', 'Rosaceae', 'Caryophyllaceae', 'Succisa', 'Sphagnum', 'Pteridium', 'Polypodium', 'Lycopodium annotinum', 'Huperzia', 'Nymphaea', 'Potamogeton', 'Pediastrum', 'Botryococcus', 'HdV-18', 'Gelasinospora', 'Reworked pre-Quaternary', 'Eucalyptus (exotic marker)', 'Crumpled', 'Corroded'];
  const groups = ['trees', 'trees', 'trees', 'trees', 'trees', 'trees', 'trees', 'shrubs', 'shrubs', 'dwarf shrubs, sum', 'dwarf shrubs', 'dwarf shrubs', ...Array(13).fill('herbs'), 'spores', 'spores', 'spores', 'spores', 'spores', 'aquatics', 'aquatics', 'algae, outside', 'algae', 'NPP, outside', 'NPP', 'reworked, outside', 'exotic, marker', 'indet, indeterminable', 'indet'];
  const list = parseTaxonList(names.map((n, i) => `${n}, ${groups[i]}`).join('\n'), 'forty.txt');
  if (!list.ok) throw new Error(list.message);
  const made = keymapFromList(list.entries, 'Forty taxa of an upland mire', 'forty.json');
  if (!made.ok) throw new Error(made.message);
  const k = parseKeymap(made.text, 'forty.json');
  if (!k.ok) throw new Error(k.message);
  return k.keymap;
}

const cases: [string, () => Keymap, Paper][] = [
  ['the lowland keymap on A4', () => loadKeymap('temperate-lowland').keymap, 'a4'],
  ['the keypad keymap on Letter', () => loadKeymap('keypad').keymap, 'letter'],
  ['40 taxa with groups of their own on A4', fortyTaxa, 'a4'],
  ['a space bar, keys off the drawing and a taxon out of the sum, on Letter', () => {
    const k = parseKeymap('{"name":"Odd keys","keys":{"9":{"taxon":"Betula","group":"trees"}," ":{"taxon":"Pinus","group":"trees"},"Q":{"taxon":"Quercus robur-type","group":"trees"},"Ä":{"taxon":"Alnus glutinosa","group":"trees"},"1":{"taxon":"Poaceae","group":"herbs","inSum":false}}}', 'odd.json');
    if (!k.ok) throw new Error(k.message);
    return k.keymap;
  }, 'letter'],
];

describe('the key card', () => {
  it.each(cases)('%s: valid SVG, every key with its taxon, no text over another, all on the page', (_, make, paper) => {
    const keymap = make();
    const svg = keyCardSvg(keymap, paper);
    const doc = parseSvg(svg);
    const root = doc.documentElement as Element;
    expect(root.getAttribute('viewBox')).toBe(`0 0 ${PAPER[paper].w} ${PAPER[paper].h}`);
    const drawn = new Map(Array.from(doc.getElementsByTagName('g')).map((g: Element) => [g.getAttribute('data-key'), g]));
    const allText = Array.from(doc.getElementsByTagName('text')).map((t: Element) => t.textContent).join(' ');
    for (const key of keymap.order) {
      const g = drawn.get(key);
      // A key the drawing has no place for (a capital, Ä) is listed under it with its taxon.
      if (!g && !/^[a-z0-9 ]$/.test(key)) {
        expect(allText).toContain(`${key} ${keymap.keys[key]?.taxon}`);
        continue;
      }
      expect(g, `key ${key}`).toBeDefined();
      expect(g?.getAttribute('data-group')).toBe(keymap.keys[key]?.group);
      // The taxon's first word, or its start when a long word had to be cut.
      const words = Array.from((g as Element).getElementsByTagName('text')).filter((t: Element) => t.getAttribute('class') === 'taxon').map((t: Element) => t.textContent).join(' ');
      expect(words.replace(/…/g, '')).toContain((keymap.keys[key]?.taxon ?? '').split(' ')[0]?.slice(0, 6));
    }
    const boxes = textBoxes(doc);
    for (let i = 0; i < boxes.length; i++) {
      const a = boxes[i] as Box;
      expect(a.x0 >= 0 && a.y0 >= 0 && a.x1 <= PAPER[paper].w && a.y1 <= PAPER[paper].h, `"${a.text}" on the page`).toBe(true);
      for (let j = i + 1; j < boxes.length; j++) expect(overlap(a, boxes[j] as Box), `"${a.text}" over "${boxes[j]?.text}"`).toBe(false);
    }
  });

  it('tells the groups apart by shape and letter as well as colour', () => {
    const doc = parseSvg(keyCardSvg(fortyTaxa()));
    const keys = Array.from(doc.getElementsByTagName('g')).filter((g: Element) => g.getAttribute('data-group'));
    const lookOf = new Map<string, string>();
    for (const g of keys) {
      const shape = Array.from(g.childNodes).find((c) => ['circle', 'polygon'].includes((c as Element).tagName) || ((c as Element).tagName === 'rect' && (c as Element).getAttribute('fill') !== '#fff' && (c as Element).getAttribute('fill') !== 'none')) as Element;
      const letter = Array.from(g.getElementsByTagName('text')).find((t: Element) => t.getAttribute('fill') === '#fff')?.textContent;
      lookOf.set(g.getAttribute('data-group') as string, `${shape.tagName}:${shape.getAttribute('points')?.split(' ').length ?? ''}:${shape.getAttribute('fill')}:${letter}`);
    }
    const looks = [...lookOf.values()];
    expect(new Set(looks.map((l) => l.split(':').at(-1))).size).toBe(looks.length);
    expect(lookOf.size).toBeGreaterThan(8);
  });

  it('renders to a PNG (resvg) with ink on it', () => {
    const svg = keyCardSvg(fortyTaxa());
    const image = new Resvg(svg, { fitTo: { mode: 'width', value: 1200 }, font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans Mono' } }).render();
    expect(image.width).toBe(1200);
    expect(image.height).toBe(Math.round((1200 * 210) / 297));
    const px = image.pixels;
    let dark = 0;
    for (let i = 0; i < px.length; i += 4) if ((px[i] as number) + (px[i + 1] as number) + (px[i + 2] as number) < 300) dark++;
    const share = dark / (px.length / 4);
    // Lettering and borders, not a blank page and not a black one.
    expect(share).toBeGreaterThan(0.01);
    expect(share).toBeLessThan(0.3);
    expect(image.asPng().subarray(1, 4).toString()).toBe('PNG');
  });
});

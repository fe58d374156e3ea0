import { afterEach, describe, expect, it } from 'vitest';
import { localClock, localDate, localDateTime, localTime, showTimesIn } from '../../src/text/local-time.js';
import { traverseHeading, traverseLine, traverseStart } from '../../src/screens/audit-lines.js';
import type { TraverseRow } from '../../src/audit/level-audit.js';

// Offsets of these zones are fixed by law (IANA tz database): Berlin is UTC+1 in winter, UTC+2 in summer.
describe('local times with their zone', () => {
  afterEach(() => showTimesIn(undefined));

  it('shows the zone of the moment: winter and summer time, and UTC for a machine set to UTC', () => {
    expect(localDateTime('2026-01-15T03:45:00.000Z', 'Europe/Berlin')).toBe('2026-01-15 04:45 UTC+1');
    expect(localDateTime('2026-07-15T03:45:00.000Z', 'Europe/Berlin')).toBe('2026-07-15 05:45 UTC+2');
    // Offsets of half and three quarters of an hour, east and west (IANA tz database).
    expect(localDateTime('2026-07-15T03:45:00.000Z', 'Asia/Kolkata')).toBe('2026-07-15 09:15 UTC+5:30');
    expect(localDateTime('2026-01-15T03:45:00.000Z', 'America/St_Johns')).toBe('2026-01-15 00:15 UTC-3:30');
    expect(localDateTime('2026-07-15T03:45:00.000Z', 'Pacific/Chatham')).toBe('2026-07-15 16:30 UTC+12:45');
    expect(localDateTime('2026-07-15T03:45:00.000Z', 'UTC')).toBe('2026-07-15 03:45 UTC');
    // The tests run with TZ=UTC (tests/helpers/isolate-config.ts): the computer's zone is that one.
    expect(localDateTime('2026-07-15T03:45:00.000Z')).toBe('2026-07-15 03:45 UTC');
  });

  it("the computer's zone, read from Date without Intl, gives what Intl gives for that zone, across changes of summer time", () => {
    const before = process.env.TZ;
    try {
      for (const zone of ['Europe/Berlin', 'America/New_York', 'America/St_Johns', 'Asia/Kolkata', 'Australia/Lord_Howe', 'Pacific/Chatham', 'Europe/London', 'UTC']) {
        // Node takes a new TZ at once: the computer's zone is now this one.
        process.env.TZ = zone;
        // Every 37 minutes and 13 seconds through 2026, through each zone's changes of time.
        for (let t = Date.parse('2026-01-01T00:00:00.000Z'); t < Date.parse('2027-01-01T00:00:00.000Z'); t += 2_233_000) {
          const iso = new Date(t).toISOString();
          expect(localTime(iso, undefined), `${zone} ${iso}`).toEqual(localTime(iso, zone));
        }
      }
    } finally {
      process.env.TZ = before;
    }
    expect(localDateTime('2026-07-15T03:45:00.000Z')).toBe('2026-07-15 03:45 UTC');
  });

  it('a date can change with the zone', () => {
    expect(localDate('2026-11-02T23:30:00.000Z', 'Europe/Berlin')).toBe('2026-11-03');
    expect(localClock('2026-11-02T23:30:00.000Z', true, 'America/New_York')).toBe('18:30:00');
  });
});

const row = (over: Partial<TraverseRow>): TraverseRow => ({
  traverse: 3,
  slide: null,
  start: '2026-11-02T09:00:00.000Z',
  sittingStart: '2026-11-02T08:30:00.000Z',
  empty: false,
  takenBack: null,
  activeMs: 120_000,
  grains: 40,
  recorded: 40,
  types: 3,
  perMinute: 20,
  newTypes: [],
  newOthers: [],
  cf: [],
  undos: 0,
  voided: 0,
  voidedWhole: null,
  notes: 0,
  byTaxon: [],
  events: [],
  ...over,
});

describe("the audit's start column", () => {
  afterEach(() => showTimesIn(undefined));

  it('carries a date when the traverse starts on another day than its sitting, in local time', () => {
    expect(traverseStart(row({}))).toBe('09:00:00');
    expect(traverseStart(row({ start: '2026-11-03T00:10:00.000Z', sittingStart: '2026-11-02T22:00:00.000Z' }))).toBe('11-03 00:10');
    // In Berlin both are on 3 November: no date needed.
    showTimesIn('Europe/Berlin');
    expect(traverseStart(row({ start: '2026-11-03T00:10:00.000Z', sittingStart: '2026-11-02T23:30:00.000Z' }))).toBe('01:10:00');
  });

  it('at 140 columns the headings are written in full, over columns that line up with the rows', () => {
    const heading = traverseHeading(140);
    expect(heading).toMatch(/#\s+start\s+time\s+grains\s+types\s+\/min\s+new types\s+undos\s+voids\s+notes$/);
    const line = ` ${traverseLine(row({ newTypes: ['Alnus', 'Betula'], undos: 1, notes: 2 }), 140)}`;
    for (const [word, value] of [['grains', '40'], ['types', '3'], ['new types', '2'], ['undos', '1'], ['notes', '2']] as const) {
      expect(line.slice(0, heading.indexOf(word) + word.length).endsWith(value)).toBe(true);
    }
    expect(traverseLine(row({ grains: 0, recorded: 0, empty: true, takenBack: 12 }), 80)).toMatch(/ empty \(taken back by #12\)$/);
  });
});

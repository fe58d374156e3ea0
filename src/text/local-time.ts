/**
 * Times as the analyst lives them. Files keep UTC; screens and reports show the
 * local time of the zone the computer is set to (or one given, for tests), with
 * its offset from UTC at that moment ("UTC+2", "UTC", "UTC-3:30"): unambiguous,
 * where short names are not (IST is India's, Ireland's and Israel's).
 */
export interface LocalTime {
  /** "2026-07-02" */
  readonly date: string;
  /** "15:05:09" */
  readonly clock: string;
  /** "UTC+2" */
  readonly zone: string;
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/** "UTC" for an offset of 0 minutes east of UTC, else "UTC+1", "UTC+5:30", "UTC-4". */
function offsetName(minutesEast: number): string {
  if (minutesEast === 0) return 'UTC';
  const a = Math.abs(minutesEast);
  return `UTC${minutesEast > 0 ? '+' : '-'}${Math.floor(a / 60)}${a % 60 ? `:${pad(a % 60)}` : ''}`;
}

const formats = new Map<string, Intl.DateTimeFormat>();

function formatFor(zone: string): Intl.DateTimeFormat {
  let f = formats.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', {
      timeZone: zone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
      hourCycle: 'h23',
      timeZoneName: 'longOffset',
    });
    formats.set(zone, f);
  }
  return f;
}

/** The zone that times are shown in: the computer's, unless one was given. */
let shownZone: string | undefined;

/** Show times in this IANA zone from now on (tests; undefined: the computer's zone again). */
export function showTimesIn(zone: string | undefined): void {
  shownZone = zone;
}

export function localTime(iso: string, zone: string | undefined = shownZone): LocalTime {
  const d = new Date(iso);
  if (zone === undefined) {
    // The computer's zone, from Date's own local fields: Intl's first use costs 10–20 ms of a start.
    return {
      date: `${pad(d.getFullYear(), 4)}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`,
      clock: `${pad(d.getHours())}:${pad(d.getMinutes())}:${pad(d.getSeconds())}`,
      zone: offsetName(-d.getTimezoneOffset()),
    };
  }
  const parts: Record<string, string> = {};
  for (const p of formatFor(zone).formatToParts(d)) parts[p.type] = p.value;
  // "GMT+05:30", "GMT-04:00", or "GMT" at UTC.
  const m = /^GMT(?:([+-])(\d{2}):(\d{2}))?$/.exec(parts.timeZoneName ?? '');
  const east = m?.[1] ? (m[1] === '+' ? 1 : -1) * (Number(m[2]) * 60 + Number(m[3])) : 0;
  return { date: `${parts.year}-${parts.month}-${parts.day}`, clock: `${parts.hour}:${parts.minute}:${parts.second}`, zone: offsetName(east) };
}

/** "2026-07-02 15:05 UTC+2" */
export function localDateTime(iso: string, zone?: string): string {
  const t = localTime(iso, zone);
  return `${t.date} ${t.clock.slice(0, 5)} ${t.zone}`;
}

/** "2026-07-02" in local time. */
export function localDate(iso: string, zone?: string): string {
  return localTime(iso, zone).date;
}

/** "15:05:09", or "15:05" with `seconds` false. */
export function localClock(iso: string, seconds = true, zone?: string): string {
  const c = localTime(iso, zone).clock;
  return seconds ? c : c.slice(0, 5);
}

/** The zone's offset at that moment ("UTC+2" in summer, "UTC+1" in winter in Berlin). */
export function zoneOf(iso: string, zone?: string): string {
  return localTime(iso, zone).zone;
}

/**
 * Times as the analyst lives them. Files keep UTC; screens and reports show the
 * local time of the zone the computer is set to (or one given, for tests), with
 * the zone's short name ("CEST", "UTC", "GMT-4").
 */
export interface LocalTime {
  /** "2026-07-02" */
  readonly date: string;
  /** "15:05:09" */
  readonly clock: string;
  /** "CEST" */
  readonly zone: string;
}

const formats = new Map<string, Intl.DateTimeFormat>();

function formatFor(zone: string | undefined): Intl.DateTimeFormat {
  const name = zone ?? '';
  let f = formats.get(name);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', {
      ...(zone ? { timeZone: zone } : {}),
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
      hourCycle: 'h23',
      timeZoneName: 'short',
    });
    formats.set(name, f);
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
  const parts: Record<string, string> = {};
  for (const p of formatFor(zone).formatToParts(new Date(iso))) parts[p.type] = p.value;
  return { date: `${parts.year}-${parts.month}-${parts.day}`, clock: `${parts.hour}:${parts.minute}:${parts.second}`, zone: parts.timeZoneName ?? '' };
}

/** "2026-07-02 15:05 CEST" */
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

/** The zone's short name at that moment ("CEST" in summer, "CET" in winter). */
export function zoneOf(iso: string, zone?: string): string {
  return localTime(iso, zone).zone;
}

import { useEffect, useState } from 'react';

/** The current time, refreshed every `intervalMs` (the watch countdown and the time field). */
export function useNow(intervalMs = 1000): Date {
  const [now, setNow] = useState(() => new Date());
  useEffect(() => {
    const t = setInterval(() => setNow(new Date()), intervalMs);
    return () => clearInterval(t);
  }, [intervalMs]);
  return now;
}

const pad = (n: number) => String(n).padStart(2, '0');

/** `HH:MM` in a time zone, for showing beside UTC; the zone name itself if it is unknown. */
export function zoneTime(d: Date, timeZone: string): string {
  try {
    return new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(d);
  } catch {
    return `${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}`;
  }
}

/** Whether the browser knows an IANA time zone name. */
export function isKnownTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone });
    return true;
  } catch {
    return false;
  }
}

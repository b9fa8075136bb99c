// The age of a chart or grid as the lists and the map legend show it ("2 d 5 h old").
export function productAge(time: string, now: Date): string {
  const h = (now.getTime() - Date.parse(time)) / 3_600_000;
  if (!Number.isFinite(h)) return '';
  if (h < 0) return `valid in ${Math.round(-h)} h`;
  if (h < 48) return `${Math.round(h)} h old`;
  const d = Math.floor(h / 24);
  return `${d} d ${Math.round(h - d * 24)} h old`;
}

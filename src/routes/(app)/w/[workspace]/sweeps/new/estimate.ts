/**
 * Rough evaluation rates for the builder's time estimate, per worker process. Budget mode is
 * bound by writing result rows (STACK.md: ~100,000 rows/s through the connector's batch, less
 * with ranking and two cores shared); ascent mode by the targeted simulation (STACK.md:
 * ~1,000 RK4 ascents/s on one core, and targeting flies ~20 of them per case).
 */
export function casesPerSecond(mode: string): number {
  return mode === 'ascent' ? 50 : 20_000;
}

/** "4 s", "3 min", "2 h 10 min". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return '—';
  if (seconds < 1) return 'under a second';
  if (seconds < 90) return `${Math.round(seconds)} s`;
  const min = seconds / 60;
  if (min < 90) return `${Math.round(min)} min`;
  const h = Math.floor(min / 60);
  const m = Math.round(min - h * 60);
  return m ? `${h} h ${m} min` : `${h} h`;
}

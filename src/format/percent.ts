const PERCENT_FORMAT = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 2 });

/** A measured rate (0 to 1) with one decimal, `96.5 %`; an em dash when there was nothing to measure. */
export function formatRate(rate: number | null): string {
  // Rounded on the per-mille first: 0.1235 reads 12.4 %, where (0.1235 * 100).toFixed(1) gives 12.3.
  return rate === null ? '—' : `${(Math.round(rate * 1000) / 10).toFixed(1)} %`;
}

/** A setting given as a fraction (0.15) as people write it: `15 %`, `12.5 %`. */
export function formatPercent(fraction: number): string {
  return `${PERCENT_FORMAT.format(fraction * 100)} %`;
}

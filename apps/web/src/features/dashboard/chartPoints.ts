import type { DashboardChartDto } from '@hitchbook/shared/schemas/reports';

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "2026-09-14" reads as "14 Sep" under a bar; other labels (customer names) stay as they are. */
export function shortLabel(label: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(label);
  if (!match) return label;
  return `${Number(match[3])} ${MONTHS[Number(match[2]) - 1]}`;
}

/** Chart rows: numbers for plotting only, the table view prints the decimal strings. */
export function chartRows(chart: DashboardChartDto): Array<{ label: string; value: number }> {
  return chart.points.map((p) => ({ label: shortLabel(p.label), value: Number(p.value) }));
}

export function hasValues(chart: DashboardChartDto): boolean {
  return chart.points.some((p) => Number(p.value) !== 0);
}

/** Week-by-week charts run left to right; charts of names lie on their side so long names stay readable. */
export function isTimeSeries(chart: DashboardChartDto): boolean {
  return chart.points.every((p) => /^\d{4}-\d{2}-\d{2}$/.test(p.label));
}

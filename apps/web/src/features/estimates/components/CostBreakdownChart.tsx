import { BarChart } from '@mantine/charts';
import { formatMoney } from '@hitchbook/shared/money';
import type { MachineCostEstimate } from '../api/estimateMachineCost';
import { BREAKDOWN_LABELS, OPERATING_PARTS, OWNERSHIP_PARTS } from '../breakdownLabels';

// Ownership parts in teal, operating parts in clay, so the two bars read as two families.
const SERIES_COLORS = {
  capitalRecovery: 'harbor.8',
  tih: 'harbor.4',
  repairs: 'clay.8',
  fuel: 'clay.6',
  lube: 'clay.3',
  labor: 'slate.5',
} as const;

/** Per-hour cost as two stacked bars: what owning costs and what running costs. */
export function CostBreakdownChart({ estimate }: { estimate: MachineCostEstimate }) {
  // Numbers for plotting only; every printed figure comes from the decimal strings.
  const bar = (label: string, keys: readonly (keyof typeof SERIES_COLORS)[]) => {
    const row: Record<string, string | number> = { part: label };
    for (const key of Object.keys(SERIES_COLORS) as (keyof typeof SERIES_COLORS)[]) {
      row[key] = keys.includes(key) ? Number(estimate.perHour[key]) : 0;
    }
    return row;
  };
  const data = [bar('Ownership', OWNERSHIP_PARTS), bar('Operating', OPERATING_PARTS)];
  const series = (Object.keys(SERIES_COLORS) as (keyof typeof SERIES_COLORS)[]).map((key) => ({
    name: key,
    label: BREAKDOWN_LABELS[key],
    color: SERIES_COLORS[key],
  }));

  return (
    <BarChart
      h={300}
      data={data}
      dataKey="part"
      type="stacked"
      series={series}
      withLegend
      legendProps={{ verticalAlign: 'bottom', height: 70 }}
      valueFormatter={(value) => formatMoney(value)}
      yAxisLabel="$ per hour"
      maxBarWidth={120}
      data-testid="cost-chart"
    />
  );
}

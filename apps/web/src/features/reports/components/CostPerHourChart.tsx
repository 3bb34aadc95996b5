import { BarChart } from '@mantine/charts';
import { formatMoney } from '@hitchbook/shared/money';
import type { CostPerHourPointDto } from '@hitchbook/shared/schemas/reports';
import { COST_CATEGORY_LABELS } from '../../machines/labels';
import { CATEGORY_COLORS } from '../labels';
import { costPerHourChart } from '../yearEnd';

/** Loaded on its own so the charting library is fetched only where a chart is shown. */
export default function CostPerHourChart({ points }: { points: CostPerHourPointDto[] }) {
  const { data, categories } = costPerHourChart(points);
  return (
    <BarChart
      h={Math.max(280, data.length * 34)}
      data={data}
      dataKey="name"
      type="stacked"
      orientation="vertical"
      series={categories.map((c) => ({ name: c, label: COST_CATEGORY_LABELS[c], color: CATEGORY_COLORS[c] }))}
      withLegend
      legendProps={{ verticalAlign: 'bottom' }}
      valueFormatter={(value) => formatMoney(value)}
      yAxisProps={{ width: 150 }}
      data-testid="cost-per-hour-chart"
    />
  );
}

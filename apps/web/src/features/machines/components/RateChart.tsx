import { BarChart } from '@mantine/charts';
import { formatMoney } from '@hitchbook/shared/money';

export interface RateBar {
  label: string;
  /** Dollars per hour, converted for plotting only; the table prints the decimal strings. */
  perHour: number;
}

/** Loaded on its own so the charting library is fetched only where a chart is shown. */
export default function RateChart({ bars }: { bars: RateBar[] }) {
  return (
    <BarChart
      h={200}
      data={bars}
      dataKey="label"
      series={[{ name: 'perHour', label: 'Per hour', color: 'harbor.6' }]}
      valueFormatter={(value) => formatMoney(value)}
      maxBarWidth={72}
      withBarValueLabel
      yAxisProps={{ width: 70 }}
      data-testid="rate-chart"
    />
  );
}

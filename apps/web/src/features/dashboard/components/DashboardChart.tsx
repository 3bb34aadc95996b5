import { BarChart, LineChart } from '@mantine/charts';
import { formatMoney } from '@hitchbook/shared/money';
import type { DashboardChart as Chart } from '../api/getDashboard';
import { formatDecimal } from '../../../lib/money';
import { chartRows, isTimeSeries } from '../chartPoints';

/** Loaded on its own so the charting library is fetched only where a chart is shown. */
export default function DashboardChart({ chart }: { chart: Chart }) {
  const usd = chart.unit === 'usd';
  const data = chartRows(chart);
  // Tooltips give the exact figure; axis ticks stay short so they never wrap.
  const valueFormatter = (value: number) => (usd ? formatMoney(value) : `${formatDecimal(value, 1)} h`);
  const tick = (value: number) => (usd ? formatMoney(Math.round(value)).slice(0, -3) : formatDecimal(value, 0));
  const series = [{ name: 'value', label: usd ? 'Amount' : 'Hours', color: 'harbor.6' }];
  if (chart.kind === 'line') {
    return <LineChart h={220} data={data} dataKey="label" series={series} valueFormatter={valueFormatter} yAxisProps={{ width: 60, tickFormatter: tick }} curveType="monotone" />;
  }
  if (isTimeSeries(chart)) {
    return <BarChart h={220} data={data} dataKey="label" series={series} valueFormatter={valueFormatter} yAxisProps={{ width: 60, tickFormatter: tick }} maxBarWidth={48} />;
  }
  return (
    <BarChart
      h={Math.max(160, data.length * 48)}
      data={data}
      dataKey="label"
      orientation="vertical"
      series={series}
      valueFormatter={valueFormatter}
      // Room at the right for the label of the longest bar.
      xAxisProps={{ tickFormatter: tick, padding: { right: 70 } }}
      yAxisProps={{ width: 170 }}
      withBarValueLabel
      maxBarWidth={36}
    />
  );
}

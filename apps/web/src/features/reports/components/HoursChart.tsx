import { BarChart } from '@mantine/charts';
import type { MachineHoursHistoryDto } from '@hitchbook/shared/schemas/reports';
import { formatDecimal } from '../../../lib/money';
import { YEAR_COLORS } from '../labels';
import { hoursPerYearChart } from '../yearEnd';

/** Loaded on its own so the charting library is fetched only where a chart is shown. */
export default function HoursChart({ history }: { history: MachineHoursHistoryDto }) {
  const { data, years } = hoursPerYearChart(history);
  const shown = years.slice(-YEAR_COLORS.length);
  return (
    <BarChart
      h={Math.max(280, data.length * 34)}
      data={data}
      dataKey="name"
      orientation="vertical"
      series={shown.map((year, i) => ({ name: year, label: year, color: YEAR_COLORS[YEAR_COLORS.length - shown.length + i] ?? 'harbor.6' }))}
      withLegend
      legendProps={{ verticalAlign: 'bottom' }}
      valueFormatter={(value) => `${formatDecimal(value, 1)} h`}
      yAxisProps={{ width: 150 }}
      data-testid="hours-chart"
    />
  );
}

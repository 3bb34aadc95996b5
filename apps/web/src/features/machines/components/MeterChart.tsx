import { LineChart } from '@mantine/charts';
import type { MeterReadingDto } from '@hitchbook/shared/schemas/machines';
import { formatDecimal } from '../../../lib/money';
import { meterPoints } from '../meterChart';

/** Loaded on its own so the charting library is fetched only where a chart is shown. */
export default function MeterChart({ readings }: { readings: readonly MeterReadingDto[] }) {
  const data = meterPoints(readings);
  return (
    <LineChart
      h={260}
      data={data}
      dataKey="day"
      series={[{ name: 'totalHours', label: 'Machine hours', color: 'harbor.7' }]}
      curveType="linear"
      withDots={data.length <= 40}
      valueFormatter={(value) => `${formatDecimal(value, 1)} h`}
      yAxisProps={{ domain: ['dataMin', 'dataMax'], width: 70, tickFormatter: (value: number) => formatDecimal(value, 0) }}
      xAxisProps={{ minTickGap: 24 }}
      data-testid="meter-chart"
    />
  );
}

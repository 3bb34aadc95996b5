import { BarChart } from '@mantine/charts';
import { formatMoney } from '@hitchbook/shared/money';
import type { StatementHouseholdDto } from '@hitchbook/shared/schemas/square-ups';
import { balanceBars } from '../statement';

/** Loaded on its own so the charting library is fetched only where a chart is shown. */
export default function BalanceChart({ households }: { households: StatementHouseholdDto[] }) {
  return (
    <BarChart
      h={260}
      data={balanceBars(households)}
      dataKey="name"
      series={[{ name: 'balance', label: 'Balance', color: 'harbor.6' }]}
      getBarColor={(value) => (value < 0 ? 'clay.6' : 'harbor.6')}
      valueFormatter={(value) => formatMoney(value)}
      withBarValueLabel
      referenceLines={[{ y: 0, color: 'slate.5' }]}
      yAxisProps={{ width: 80 }}
      // Every household's name under its bar, even when recharts would skip one for room.
      xAxisProps={{ interval: 0 }}
      maxBarWidth={90}
      data-testid="balance-chart"
    />
  );
}

import { BarChart } from '@mantine/charts';
import { formatMoney } from '@hitchbook/shared/money';
import type { StatementHouseholdDto } from '@hitchbook/shared/schemas/square-ups';
import { balanceBars } from '../statement';

/**
 * Loaded on its own so the charting library is fetched only where a chart is shown. Bars lie on
 * their side so household names stay readable on a phone: owed to the right, owing to the left.
 */
export default function BalanceChart({ households }: { households: StatementHouseholdDto[] }) {
  return (
    <BarChart
      h={Math.max(180, households.length * 64)}
      data={balanceBars(households)}
      dataKey="name"
      orientation="vertical"
      series={[{ name: 'balance', label: 'Balance', color: 'harbor.6' }]}
      getBarColor={(value) => (value < 0 ? 'clay.6' : 'harbor.6')}
      valueFormatter={(value) => formatMoney(value)}
      // Whole dollars on the axis ("-$3,500"); the tooltip and labels give the cents.
      xAxisProps={{ tickFormatter: (value: number) => formatMoney(Math.round(value)).slice(0, -3) }}
      yAxisProps={{ width: 120 }}
      referenceLines={[{ x: 0, color: 'slate.5' }]}
      maxBarWidth={40}
      data-testid="balance-chart"
    />
  );
}

import { BarChart } from '@mantine/charts';
import { formatMoney } from '@hitchbook/shared/money';
import type { CustomIncomeReportDto } from '@hitchbook/shared/schemas/reports';

/** Loaded on its own so the charting library is fetched only where a chart is shown. */
export default function IncomeChart({ byCustomer }: { byCustomer: CustomIncomeReportDto['byCustomer'] }) {
  // Numbers for plotting only; the table beside it prints the decimal strings.
  const data = byCustomer.map((c) => ({ name: c.name, amount: Number(c.amount) }));
  return (
    <BarChart
      h={Math.max(200, data.length * 44)}
      data={data}
      dataKey="name"
      orientation="vertical"
      series={[{ name: 'amount', label: 'Invoiced', color: 'harbor.6' }]}
      valueFormatter={(value) => formatMoney(value)}
      withBarValueLabel
      yAxisProps={{ width: 170 }}
      xAxisProps={{ padding: { right: 60 } }}
      data-testid="income-chart"
    />
  );
}

import { useState } from 'react';
import {
  ActionIcon,
  Badge,
  Button,
  Card,
  Grid,
  Group,
  SegmentedControl,
  SimpleGrid,
  Stack,
  Table,
  Text,
  TextInput,
  Title,
} from '@mantine/core';
import { IconArrowRight, IconPlus, IconTrash } from '@tabler/icons-react';
import { formatMoney } from '@hitchbook/shared/money';
import { jointOwnershipRequestSchema } from '@hitchbook/shared/schemas/estimates';
import { Decimal } from 'decimal.js';
import { DecimalInput } from '../../../components/DecimalInput';
import { EmptyState } from '../../../components/EmptyState';
import { EstimateNotice } from '../../../components/EstimateNotice';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { PageHeader } from '../../../components/PageHeader';
import { useServerForm } from '../../../lib/form';
import { formatDecimal } from '../../../lib/money';
import { usePlanJointOwnership, type JointOwnershipPlan } from '../api/planJointOwnership';
import {
  initialJointOwnership,
  jointOwnershipIssuePath,
  newCost,
  newMember,
  sumOfTyped,
  toJointOwnershipRequest,
} from '../jointOwnershipForm';

const MAX_MEMBERS = 6;

function RunningSum({ label, sum, target, unit }: { label: string; sum: Decimal; target: Decimal | null; unit: string }) {
  const ok = target === null || sum.eq(target);
  return (
    <Text size="sm" c={ok ? 'slate.7' : 'clay.8'} fw={ok ? 400 : 700}>
      {label}: {unit === '$' ? formatMoney(sum) : `${formatDecimal(sum, 2)} ${unit}`}
      {target !== null && !ok && ` of ${unit === '$' ? formatMoney(target) : `${formatDecimal(target, 0)} ${unit}`}`}
    </Text>
  );
}

function PlanResult({ plan, settleBy }: { plan: JointOwnershipPlan; settleBy: 'use' | 'ownership' }) {
  return (
    <Stack gap="md" data-testid="joint-ownership-result">
      <Card withBorder padding="lg" bg="harbor.9" c="white">
        <Text size="sm" fw={700} tt="uppercase" c="harbor.1">
          Total cost to share
        </Text>
        <Text fz={38} fw={700} lh={1.1}>
          {formatMoney(plan.totalCost)}
        </Text>
        <Text c="harbor.1">Split by {settleBy === 'use' ? 'each household’s use' : 'ownership share'}.</Text>
      </Card>
      <Card withBorder padding="md">
        <Title order={2} size="h4" mb="sm">
          Shares and balances
        </Title>
        <Table.ScrollContainer minWidth={320}>
          <Table verticalSpacing="sm" horizontalSpacing="xs" fz="sm" data-testid="shares">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Household</Table.Th>
                <Table.Th ta="right">Share</Table.Th>
                <Table.Th ta="right">Paid</Table.Th>
                <Table.Th ta="right">Balance</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {plan.members.map((m) => {
                const balance = new Decimal(m.balance);
                return (
                  <Table.Tr key={m.id}>
                    <Table.Td fw={700}>{m.id}</Table.Td>
                    <Table.Td ta="right">{formatMoney(m.share)}</Table.Td>
                    <Table.Td ta="right">{formatMoney(m.paid)}</Table.Td>
                    <Table.Td ta="right">
                      <Text fw={700} size="sm" c={balance.isNeg() ? 'clay.8' : 'harbor.8'}>
                        {formatMoney(m.balance)}
                      </Text>
                      <Text size="xs" c="dimmed">
                        {balance.isZero() ? 'square' : balance.isNeg() ? 'owes' : 'is owed'}
                      </Text>
                    </Table.Td>
                  </Table.Tr>
                );
              })}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      </Card>
      <Card withBorder padding="md">
        <Title order={2} size="h4" mb="sm">
          Payments that square everyone up
        </Title>
        {plan.transfers.length === 0 ? (
          <Text>Everyone has paid their share: nobody owes anything.</Text>
        ) : (
          <Table verticalSpacing="sm" fz="md" data-testid="transfers">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Who pays</Table.Th>
                <Table.Th />
                <Table.Th>Whom</Table.Th>
                <Table.Th ta="right">Amount</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {plan.transfers.map((t) => (
                <Table.Tr key={`${t.from}->${t.to}`}>
                  <Table.Td fw={700}>{t.from}</Table.Td>
                  <Table.Td w={32}>
                    <IconArrowRight size={18} aria-label="pays" />
                  </Table.Td>
                  <Table.Td fw={700}>{t.to}</Table.Td>
                  <Table.Td ta="right" fw={700}>
                    {formatMoney(t.amount)}
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        )}
      </Card>
    </Stack>
  );
}

export function Component() {
  const [result, setResult] = useState<{ plan: JointOwnershipPlan; settleBy: 'use' | 'ownership' } | null>(null);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: jointOwnershipRequestSchema,
    initialValues: initialJointOwnership(),
    toPayload: toJointOwnershipRequest,
    issuePath: jointOwnershipIssuePath,
    mutation: usePlanJointOwnership(),
    onSuccess: (plan, values) => setResult({ plan, settleBy: values.settleBy }),
  });
  const { members, costs, settleBy } = form.values;

  function addMember() {
    const current = form.getValues();
    form.setValues({
      members: [...current.members, newMember(`Household ${current.members.length + 1}`)],
      costs: current.costs.map((c) => ({ ...c, paid: [...c.paid, ''] })),
    });
  }

  function removeMember(index: number) {
    const current = form.getValues();
    form.setValues({
      members: current.members.filter((_, i) => i !== index),
      costs: current.costs.map((c) => ({ ...c, paid: c.paid.filter((_, i) => i !== index) })),
    });
  }

  return (
    <>
      <PageHeader
        title="Joint ownership planner"
        description="Share the cost of a machine that several households own or use, and see who pays whom to square up."
      />
      <Stack gap="md" mb="lg">
        <EstimateNotice />
        <Text size="sm" c="slate.8">
          Following Iowa State Extension AgDM A3-34 (Joint Machinery Ownership): when use differs from ownership, each
          household pays into the machine’s costs and the group settles by use. Fixed costs can also be split by
          ownership share. Put the arrangement in writing, including how a partner leaves and how the machine is valued
          then.
        </Text>
      </Stack>
      <Grid gutter="lg">
        <Grid.Col span={{ base: 12, lg: 7 }}>
          <Card withBorder padding="lg">
            <form onSubmit={onSubmit} noValidate>
              <Stack gap="lg">
                <FormErrorAlert message={formError} />
                <Stack gap="sm">
                  <Title order={2} size="h4" c="harbor.9">
                    Households
                  </Title>
                  {members.map((member, i) => (
                    <Card key={member.key} withBorder padding="sm" bg="slate.0">
                      <Group align="flex-start" gap="sm" wrap="nowrap">
                        <SimpleGrid cols={{ base: 1, xs: 3 }} spacing="sm" style={{ flex: 1, alignItems: 'end' }}>
                          <TextInput label="Name" {...form.getInputProps(`members.${i}.name`)} />
                          <DecimalInput label="Owns" unit="%" {...form.getInputProps(`members.${i}.ownershipPct`)} />
                          <DecimalInput
                            label="Use"
                            description="Acres or hours"
                            {...form.getInputProps(`members.${i}.use`)}
                          />
                        </SimpleGrid>
                        <ActionIcon
                          variant="subtle"
                          color="red"
                          size="xl"
                          mt={28}
                          aria-label={`Remove ${member.name || 'household'}`}
                          disabled={members.length <= 2}
                          onClick={() => removeMember(i)}
                        >
                          <IconTrash />
                        </ActionIcon>
                      </Group>
                    </Card>
                  ))}
                  {form.errors.members && (
                    <Text c="red.8" size="sm" fw={700} role="alert">
                      {form.errors.members}
                    </Text>
                  )}
                  <Group justify="space-between">
                    <RunningSum
                      label="Ownership adds up to"
                      sum={sumOfTyped(members.map((m) => m.ownershipPct))}
                      target={new Decimal(100)}
                      unit="%"
                    />
                    <Button
                      variant="light"
                      leftSection={<IconPlus size={18} />}
                      onClick={addMember}
                      disabled={members.length >= MAX_MEMBERS}
                    >
                      Add household
                    </Button>
                  </Group>
                </Stack>

                <Stack gap="sm">
                  <Title order={2} size="h4" c="harbor.9">
                    Costs and who paid them
                  </Title>
                  {costs.map((cost, c) => {
                    const amount = sumOfTyped([cost.amount]);
                    return (
                      <Card key={cost.key} withBorder padding="sm" bg="slate.0">
                        <Stack gap="sm">
                          <Group align="flex-start" gap="sm" wrap="nowrap">
                            <SimpleGrid cols={{ base: 1, xs: 2 }} spacing="sm" style={{ flex: 1 }}>
                              <TextInput label="Cost" {...form.getInputProps(`costs.${c}.label`)} />
                              <DecimalInput label="Amount" prefix="$" {...form.getInputProps(`costs.${c}.amount`)} />
                            </SimpleGrid>
                            <ActionIcon
                              variant="subtle"
                              color="red"
                              size="xl"
                              mt={28}
                              aria-label={`Remove ${cost.label || 'cost'}`}
                              disabled={costs.length <= 1}
                              onClick={() => form.removeListItem('costs', c)}
                            >
                              <IconTrash />
                            </ActionIcon>
                          </Group>
                          <SimpleGrid cols={{ base: 2, xs: Math.min(members.length, 3) }} spacing="sm">
                            {members.map((member, m) => (
                              <DecimalInput
                                key={member.key}
                                label={`Paid by ${member.name || `household ${m + 1}`}`}
                                prefix="$"
                                placeholder="0"
                                {...form.getInputProps(`costs.${c}.paid.${m}`)}
                              />
                            ))}
                          </SimpleGrid>
                          <RunningSum
                            label="Paid so far"
                            sum={sumOfTyped(cost.paid)}
                            target={cost.amount.trim() ? amount : null}
                            unit="$"
                          />
                        </Stack>
                      </Card>
                    );
                  })}
                  {form.errors.costs && (
                    <Text c="red.8" size="sm" fw={700} role="alert">
                      {form.errors.costs}
                    </Text>
                  )}
                  <Group>
                    <Button
                      variant="light"
                      leftSection={<IconPlus size={18} />}
                      onClick={() => form.insertListItem('costs', newCost(members.length))}
                    >
                      Add cost
                    </Button>
                  </Group>
                </Stack>

                <Stack gap={6}>
                  <Text fw={700}>Settle by</Text>
                  <SegmentedControl
                    fullWidth
                    data={[
                      { value: 'use', label: 'Use' },
                      { value: 'ownership', label: 'Ownership share' },
                    ]}
                    {...form.getInputProps('settleBy')}
                  />
                  <Badge variant="light" color="slate" size="lg" style={{ alignSelf: 'flex-start' }}>
                    {settleBy === 'use' ? 'Each pays in proportion to use' : 'Each pays in proportion to ownership'}
                  </Badge>
                </Stack>

                <Button type="submit" size="lg" loading={submitting} fullWidth>
                  Work out the shares
                </Button>
              </Stack>
            </form>
          </Card>
        </Grid.Col>
        <Grid.Col span={{ base: 12, lg: 5 }}>
          {result ? (
            <PlanResult plan={result.plan} settleBy={result.settleBy} />
          ) : (
            <Card withBorder padding="lg">
              <EmptyState title="No plan yet">
                Enter the households, their shares and use, and what each paid. The shares, balances and the fewest
                payments that settle them appear here.
              </EmptyState>
            </Card>
          )}
        </Grid.Col>
      </Grid>
    </>
  );
}

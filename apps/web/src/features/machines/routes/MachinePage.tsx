import { Badge, Button, Group, Select, SimpleGrid, Skeleton, Stack } from '@mantine/core';
import { IconPencil } from '@tabler/icons-react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { MONEY_ROLES } from '@hitchbook/shared/roles';
import { NotFound } from '../../../components/NotFound';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { useMachineShares } from '../api/getMachineShares';
import { useMachineSummary } from '../api/getMachineSummary';
import { CostsPanel } from '../components/CostsPanel';
import { MachineDetails } from '../components/MachineDetails';
import { MachineEntriesPanel } from '../components/MachineEntriesPanel';
import { MachinePhotoPanel } from '../components/MachinePhotoPanel';
import { MeterPanel } from '../components/MeterPanel';
import { OwnersPanel } from '../components/OwnersPanel';
import { RatePanel } from '../components/RatePanel';
import { KIND_LABELS, STATUS_COLORS, STATUS_LABELS } from '../labels';
import { mayChangeMachine } from '../shares';

/** The roles the API lets record a meter reading: the operator reads the meter in the cab. */
const METER_READERS = new Set(['owner', 'partner', 'operator']);

const YEARS_SHOWN = 6;

function readYear(raw: string | null, thisYear: number): number {
  const year = Number(raw);
  return Number.isInteger(year) && year > thisYear - 50 && year <= thisYear ? year : thisYear;
}

export function Component() {
  const { machineId = '' } = useParams();
  const user = useSessionUserOrThrow();
  const shares = useMachineShares(machineId);
  // The area is open to partners, but a machine only to the households that own it.
  const canManage = accessTo(user.role, 'machines') === 'manage' && mayChangeMachine(user.role, user.partyId ?? null, shares.data);
  const seesMoney = MONEY_ROLES.includes(user.role);
  const [searchParams, setSearchParams] = useSearchParams();
  const thisYear = new Date().getFullYear();
  const year = readYear(searchParams.get('year'), thisYear);
  const summary = useMachineSummary(machineId, year);

  if (summary.isError && isApiError(summary.error) && (summary.error.status === 404 || summary.error.status === 400)) return <NotFound />;
  if (summary.isError) return <QueryError error={summary.error} onRetry={() => void summary.refetch()} />;
  if (summary.isPending) return <Skeleton h={400} />;
  const { machine } = summary.data;

  const yearSelect = (
    <Select
      aria-label="Year"
      w={120}
      allowDeselect={false}
      value={String(year)}
      data={Array.from({ length: YEARS_SHOWN }, (_, i) => String(thisYear - i))}
      onChange={(value) =>
        setSearchParams(
          (prev) => {
            const next = new URLSearchParams(prev);
            if (!value || Number(value) === thisYear) next.delete('year');
            else next.set('year', value);
            return next;
          },
          { replace: true },
        )
      }
    />
  );

  return (
    <Stack gap="lg">
      <PageHeader
        title={machine.name}
        description={
          <Group gap="xs" component="span">
            <span>
              {machine.classLabel} · {KIND_LABELS[machine.kind]}
            </span>
            <Badge component="span" variant="light" color={STATUS_COLORS[machine.status]}>
              {STATUS_LABELS[machine.status]}
            </Badge>
          </Group>
        }
        actions={
          <>
            {yearSelect}
            {canManage && (
              <Button component={Link} to={paths.editMachine(machine.id)} variant="default" leftSection={<IconPencil size={18} />}>
                Edit
              </Button>
            )}
          </>
        }
      />
      <SimpleGrid cols={{ base: 1, lg: 2 }} spacing="lg">
        <MachineDetails machine={machine} showMoney={seesMoney} />
        <OwnersPanel machineId={machine.id} canManage={canManage} />
      </SimpleGrid>
      <MachinePhotoPanel machine={machine} canManage={canManage} />
      <MeterPanel machineId={machine.id} readings={summary.data.meterHistory} canRecord={METER_READERS.has(user.role)} />
      {seesMoney && <RatePanel summary={summary.data} />}
      {seesMoney && <CostsPanel machineId={machine.id} canManage={canManage} ownPartyId={user.partyId ?? null} />}
      <MachineEntriesPanel machineId={machine.id} showOperator={user.role !== 'operator'} />
    </Stack>
  );
}

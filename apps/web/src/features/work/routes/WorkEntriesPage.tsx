import { useState } from 'react';
import { Button, Group, Paper, Text } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { notifications } from '@mantine/notifications';
import { IconCalendarWeek, IconChecks, IconDownload, IconFileImport, IconPlus } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import type { WorkEntryDto } from '@hitchbook/shared/schemas/work-entries';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useListParams } from '../../../lib/listParams';
import { weekOf } from '../../../lib/localTime';
import { paths } from '../../../lib/paths';
import { useApproveWorkEntries } from '../api/approveWorkEntry';
import { exportWorkEntries } from '../api/exportWorkEntries';
import { useWorkEntries } from '../api/listWorkEntries';
import { entryColumns } from '../components/EntryColumns';
import { EntryFiltersBar } from '../components/EntryFiltersBar';
import { EntryRowActions } from '../components/EntryRowActions';
import { FiltersDisclosure } from '../components/FiltersDisclosure';
import { hasFilters, readEntryFilters } from '../entryFilters';

const APPROVERS = new Set(['owner', 'partner']);

export function Component() {
  const user = useSessionUserOrThrow();
  const canLog = accessTo(user.role, 'work') === 'manage';
  const approver = APPROVERS.has(user.role);
  const { params, searchParams, update } = useListParams({ sort: '-date' });
  const filters = readEntryFilters(searchParams);
  const entries = useWorkEntries({ ...filters, page: params.page, pageSize: params.pageSize });
  const approveMany = useApproveWorkEntries();
  const phone = useMediaQuery('(max-width: 48em)') ?? false;
  const [selected, setSelected] = useState<Map<string, WorkEntryDto>>(new Map());
  const [exporting, setExporting] = useState(false);
  const items = entries.data?.items ?? [];
  const submittedOnPage = items.filter((e) => e.state === 'submitted');
  const operatorName = items.find((e) => e.operatorUserId === filters.operatorUserId)?.operatorName ?? null;

  const toggle = (entry: WorkEntryDto) =>
    setSelected((current) => {
      const next = new Map(current);
      if (next.has(entry.id)) next.delete(entry.id);
      else next.set(entry.id, entry);
      return next;
    });
  const toggleAll = () =>
    setSelected((current) => {
      const allOn = submittedOnPage.every((e) => current.has(e.id));
      const next = new Map(current);
      for (const e of submittedOnPage) {
        if (allOn) next.delete(e.id);
        else next.set(e.id, e);
      }
      return next;
    });

  const rowActions = (entry: WorkEntryDto) => <EntryRowActions entry={entry} approver={approver} mine={entry.operatorUserId === user.id} />;
  const columns = entryColumns({
    totals: entries.data?.totals,
    selection: approver ? { selected: new Set(selected.keys()), selectable: submittedOnPage, toggle, toggleAll } : null,
    // An operator's table holds only their own entries, so the column would say the same name on every row.
    showOperator: user.role !== 'operator',
    onOperator: (entry) => update({ operatorUserId: entry.operatorUserId }),
    compact: phone ? { actions: canLog ? rowActions : () => null } : null,
  });

  function approveSelected() {
    const batch = [...selected.values()].map((e) => ({ id: e.id, version: e.version }));
    approveMany.mutate(batch, {
      onSuccess: (outcome) => {
        setSelected(new Map());
        notifications.show({
          color: outcome.failed.length > 0 ? 'clay' : 'harbor',
          title: `${outcome.done} entr${outcome.done === 1 ? 'y' : 'ies'} approved`,
          message: outcome.failed.length > 0 ? `${outcome.failed.length} not approved: ${outcome.failed[0]?.message}` : undefined,
        });
      },
    });
  }

  async function exportCsv() {
    setExporting(true);
    try {
      await exportWorkEntries(filters);
    } catch (error) {
      notifications.show({ color: 'red', title: 'The export did not download', message: error instanceof Error ? error.message : '' });
    } finally {
      setExporting(false);
    }
  }

  const week = weekOf();

  return (
    <>
      <PageHeader
        title={user.role === 'operator' ? 'My work' : 'Work entries'}
        description={
          approver ? 'Who ran what, where and for how long. Approve the week’s submitted entries before they are billed or squared up.' : 'Who ran what, where and for how long.'
        }
        actions={
          <>
            {canLog && (
              <Button component={Link} to={paths.work.log()} leftSection={<IconPlus size={20} />}>
                Log work
              </Button>
            )}
            {approver && (
              <Button component={Link} to={paths.work.import()} variant="light" leftSection={<IconFileImport size={20} />}>
                Import CSV
              </Button>
            )}
          </>
        }
      />
      <Group gap="sm" mb="sm" wrap="wrap">
        {approver && (
          <Button
            variant="light"
            color="clay"
            leftSection={<IconCalendarWeek size={20} />}
            component={Link}
            to={paths.work.entries({ dateFrom: week.from, dateTo: week.to, state: 'submitted' })}
          >
            This week’s submitted entries
          </Button>
        )}
        <Button variant="default" leftSection={<IconDownload size={20} />} loading={exporting} onClick={() => void exportCsv()}>
          Export CSV{hasFilters(filters) ? ' of these entries' : ''}
        </Button>
      </Group>
      {approver && selected.size > 0 && (
        <Paper withBorder radius="md" p="sm" mb="sm" bg="harbor.0" data-testid="approval-bar">
          <Group justify="space-between" gap="sm">
            <Text fw={700}>
              {selected.size} submitted entr{selected.size === 1 ? 'y' : 'ies'} selected
            </Text>
            <Group gap="sm">
              <Button variant="subtle" color="slate" onClick={() => setSelected(new Map())}>
                Clear
              </Button>
              <Button leftSection={<IconChecks size={20} />} loading={approveMany.isPending} onClick={approveSelected}>
                Approve selected
              </Button>
            </Group>
          </Group>
        </Paper>
      )}
      <ServerTable
        columns={columns}
        query={entries}
        params={params}
        onParamsChange={update}
        getRowId={(entry) => entry.id}
        toolbar={
          <FiltersDisclosure phone={phone} active={hasFilters(filters)}>
            <EntryFiltersBar role={user.role} filters={filters} operatorName={operatorName} update={update} />
          </FiltersDisclosure>
        }
        rowActions={canLog && !phone ? rowActions : undefined}
        emptyState={
          <EmptyState title={hasFilters(filters) ? 'No entries match' : 'No work logged yet'}>
            {hasFilters(filters) ? 'Widen the dates or clear a filter.' : canLog ? 'Log the first pass from the cab with “Log work”.' : undefined}
          </EmptyState>
        }
      />
    </>
  );
}

import type { ReactNode } from 'react';
import { Group, Stack } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import type { UseQueryResult } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import {
  MantineReactTable,
  useMantineReactTable,
  type MRT_ColumnDef,
  type MRT_PaginationState,
  type MRT_RowData,
  type MRT_SortingState,
  type MRT_Updater,
} from 'mantine-react-table';
import { PAGE_SIZES, sortParamFrom, sortingFromParam, type ListParams } from '../lib/listParams';
import { QueryError } from './QueryError';

function resolve<T>(updater: MRT_Updater<T>, current: T): T {
  return typeof updater === 'function' ? (updater as (old: T) => T)(current) : updater;
}

interface ServerTableProps<T extends MRT_RowData> {
  columns: MRT_ColumnDef<T>[];
  query: UseQueryResult<Page<T>>;
  params: ListParams;
  onParamsChange: (patch: Record<string, string | number | undefined>) => void;
  getRowId: (row: T) => string;
  /** Without one the list has no search box (the route does not search). */
  searchPlaceholder?: string;
  emptyState: ReactNode;
  /** Filters shown above the table, where they have room to wrap on a phone. */
  toolbar?: ReactNode;
  rowActions?: (row: T) => ReactNode;
}

/**
 * The one table recipe: mantine-react-table with paging, sorting and search done by the
 * server and mirrored in the URL.
 */
export function ServerTable<T extends MRT_RowData>(props: ServerTableProps<T>) {
  const { columns, query, params, onParamsChange, getRowId, searchPlaceholder, emptyState, toolbar, rowActions } = props;
  const pagination: MRT_PaginationState = { pageIndex: params.page - 1, pageSize: params.pageSize };
  const sorting: MRT_SortingState = sortingFromParam(params.sort);
  // On a phone the last column is off screen, so the row's buttons come first.
  const phone = useMediaQuery('(max-width: 48em)');

  const table = useMantineReactTable<T>({
    columns,
    data: query.data?.items ?? [],
    getRowId,
    rowCount: query.data?.total ?? 0,
    manualPagination: true,
    manualSorting: true,
    manualFiltering: true,
    enableColumnFilters: false,
    enableColumnActions: false,
    enableHiding: false,
    enableDensityToggle: false,
    enableFullScreenToggle: false,
    enableSortingRemoval: false,
    enableMultiSort: false,
    enableRowActions: Boolean(rowActions),
    positionActionsColumn: phone ? 'first' : 'last',
    renderRowActions: rowActions ? ({ row }) => rowActions(row.original) : undefined,
    enableGlobalFilter: Boolean(searchPlaceholder),
    // The top toolbar holds only the search box; without one it would be an empty band.
    enableTopToolbar: Boolean(searchPlaceholder),
    enableSorting: columns.some((c) => c.enableSorting !== false),
    positionGlobalFilter: 'right',
    initialState: { showGlobalFilter: Boolean(searchPlaceholder), density: 'md' },
    state: {
      pagination,
      sorting,
      globalFilter: params.q ?? '',
      isLoading: query.isPending,
      showProgressBars: query.isFetching && !query.isPending,
    },
    onPaginationChange: (updater) => {
      const next = resolve(updater, pagination);
      if (next.pageSize !== pagination.pageSize) onParamsChange({ pageSize: next.pageSize });
      else onParamsChange({ page: next.pageIndex + 1 });
    },
    onSortingChange: (updater) => onParamsChange({ sort: sortParamFrom(resolve(updater, sorting)) }),
    onGlobalFilterChange: (updater: MRT_Updater<string | undefined>) => {
      const value = resolve(updater, params.q) ?? '';
      if (value !== (params.q ?? '')) onParamsChange({ q: value || undefined });
    },
    mantineSearchTextInputProps: { placeholder: searchPlaceholder, 'aria-label': searchPlaceholder },
    mantinePaginationProps: { rowsPerPageOptions: PAGE_SIZES.map(String) },
    mantinePaperProps: { withBorder: true, shadow: 'none' },
    mantineTableContainerProps: { style: { overflowX: 'auto' } },
    renderEmptyRowsFallback: () => (query.isError ? <QueryError error={query.error} /> : emptyState),
  });

  if (!toolbar) return <MantineReactTable table={table} />;
  return (
    <Stack gap="sm">
      <Group gap="sm" wrap="wrap">
        {toolbar}
      </Group>
      <MantineReactTable table={table} />
    </Stack>
  );
}

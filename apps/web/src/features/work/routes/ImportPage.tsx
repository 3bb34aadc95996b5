import '@mantine/dropzone/styles.css';
import { useState } from 'react';
import { Accordion, Alert, Button, Group, Pagination, Paper, Progress, SegmentedControl, SimpleGrid, Stack, Table, Text, Title } from '@mantine/core';
import { Dropzone } from '@mantine/dropzone';
import { useQueryClient } from '@tanstack/react-query';
import { IconAlertTriangle, IconCheck, IconFileSpreadsheet, IconUpload } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import {
  FUEL_TICKET_IMPORT_COLUMNS,
  IMPORT_MAX_BYTES,
  WORK_ENTRY_IMPORT_COLUMNS,
  type ImportKind,
  type ImportReport,
} from '@hitchbook/shared/schemas/work-entries';
import { NotAllowed } from '../../../components/NotAllowed';
import { PageHeader } from '../../../components/PageHeader';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { importWorkEntries, type ImportMode } from '../api/importWorkEntries';
import { refreshAfterEntryChange } from '../api/saveWorkEntry';
import { canCommit, errorsPage, PREVIEW_COLUMNS, reportOfRefusal, rowsToCreate } from '../importReport';

const IMPORTERS = new Set(['owner', 'partner']);
const ERRORS_PER_PAGE = 50;
const PREVIEW_ROWS = 20;
const LIMIT_MB = IMPORT_MAX_BYTES / (1024 * 1024);

/** Sending shows the bytes gone; after the last byte the server still reads and checks every row. */
type Transfer = { mode: ImportMode; sent: number } | null;

const KIND_LABELS: Record<ImportKind, string> = { entries: 'Work entries', fuel: 'Fuel tickets' };

function ColumnsHelp({ kind }: { kind: ImportKind }) {
  const columns = kind === 'entries' ? WORK_ENTRY_IMPORT_COLUMNS : FUEL_TICKET_IMPORT_COLUMNS;
  return (
    <Accordion variant="separated" radius="md">
      <Accordion.Item value="columns">
        <Accordion.Control>Columns the file needs</Accordion.Control>
        <Accordion.Panel>
          <Table.ScrollContainer minWidth={480}>
            <Table verticalSpacing={6}>
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Header</Table.Th>
                  <Table.Th>Needed</Table.Th>
                  <Table.Th>What goes in it</Table.Th>
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {columns.map((c) => (
                  <Table.Tr key={c.header}>
                    <Table.Td fw={700}>{c.header}</Table.Td>
                    <Table.Td>{c.required ? 'Yes' : 'No'}</Table.Td>
                    <Table.Td>{c.description}</Table.Td>
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
          </Table.ScrollContainer>
        </Accordion.Panel>
      </Accordion.Item>
    </Accordion>
  );
}

function TransferProgress({ transfer }: { transfer: NonNullable<Transfer> }) {
  const checking = transfer.sent >= 1;
  const verb = transfer.mode === 'preview' ? 'Checking' : 'Importing';
  return (
    <Stack gap={6} data-testid="import-progress">
      <Text fw={600}>{checking ? `${verb} every row…` : `Sending the file… ${Math.round(transfer.sent * 100)} %`}</Text>
      <Progress size="xl" value={checking ? 100 : transfer.sent * 100} striped={checking} animated={checking} aria-label="Import progress" />
    </Stack>
  );
}

function Counts({ report }: { report: ImportReport }) {
  const committed = report.mode === 'commit';
  const stat = (label: string, value: number, testId: string, color?: string) => (
    <Paper withBorder radius="md" p="sm">
      <Text size="sm" c="dimmed">
        {label}
      </Text>
      <Text size="xl" fw={700} c={color} data-testid={testId}>
        {value}
      </Text>
    </Paper>
  );
  return (
    <SimpleGrid cols={{ base: 2, sm: 4 }}>
      {stat('Rows in the file', report.total, 'count-total')}
      {stat(committed ? 'Created' : 'Will be created', rowsToCreate(report), 'count-created', 'harbor.8')}
      {stat('Already imported, skipped', report.skipped, 'count-skipped')}
      {stat('Rows with errors', report.invalid, 'count-invalid', report.invalid > 0 ? 'red.8' : undefined)}
    </SimpleGrid>
  );
}

function ErrorsTable({ report }: { report: ImportReport }) {
  const [page, setPage] = useState(1);
  if (report.errors.length === 0) return null;
  const pages = Math.ceil(report.errors.length / ERRORS_PER_PAGE);
  return (
    <Stack gap="sm">
      <Title order={2} size="h4">
        What to fix in the file
      </Title>
      <Table.ScrollContainer minWidth={480}>
        <Table striped verticalSpacing={6} data-testid="import-errors">
          <Table.Thead>
            <Table.Tr>
              <Table.Th w={80}>Row</Table.Th>
              <Table.Th w={160}>Column</Table.Th>
              <Table.Th>Reason</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {errorsPage(report.errors, page, ERRORS_PER_PAGE).map((e, i) => (
              <Table.Tr key={`${e.row}-${e.column}-${i}`}>
                <Table.Td>{e.row}</Table.Td>
                <Table.Td>{e.column || '—'}</Table.Td>
                <Table.Td>{e.reason}</Table.Td>
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      </Table.ScrollContainer>
      {pages > 1 && <Pagination total={pages} value={page} onChange={setPage} />}
    </Stack>
  );
}

function RowsPreview({ report }: { report: ImportReport }) {
  if (report.rows.length === 0) return null;
  const columns = PREVIEW_COLUMNS[report.kind];
  return (
    <Stack gap="sm">
      <Title order={2} size="h4">
        {report.mode === 'commit' ? 'Created' : 'Will be created'}
        {report.rows.length > PREVIEW_ROWS ? ` (first ${PREVIEW_ROWS} of ${report.rows.length})` : ''}
      </Title>
      <Table.ScrollContainer minWidth={720}>
        <Table verticalSpacing={6} data-testid="import-rows">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Row</Table.Th>
              {columns.map((c) => (
                <Table.Th key={c.header}>{c.header}</Table.Th>
              ))}
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {report.rows.slice(0, PREVIEW_ROWS).map((row) => (
              <Table.Tr key={row.row}>
                <Table.Td>{row.row}</Table.Td>
                {columns.map((c) => (
                  <Table.Td key={c.header}>{c.cell(row)}</Table.Td>
                ))}
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      </Table.ScrollContainer>
    </Stack>
  );
}

export function Component() {
  const user = useSessionUserOrThrow();
  const queryClient = useQueryClient();
  const [kind, setKind] = useState<ImportKind>('entries');
  const [file, setFile] = useState<File | null>(null);
  const [transfer, setTransfer] = useState<Transfer>(null);
  const [report, setReport] = useState<ImportReport | null>(null);
  const [problem, setProblem] = useState<string | null>(null);

  if (!IMPORTERS.has(user.role)) return <NotAllowed />;

  async function send(mode: ImportMode, picked: File, as: ImportKind) {
    setProblem(null);
    setTransfer({ mode, sent: 0 });
    try {
      const result = await importWorkEntries(as, mode, picked, (sent) => setTransfer({ mode, sent }));
      setReport(result);
      if (mode === 'commit') await refreshAfterEntryChange(queryClient);
    } catch (error) {
      const refused = reportOfRefusal(error);
      setReport(refused);
      setProblem(error instanceof Error ? error.message : 'The file could not be sent.');
    } finally {
      setTransfer(null);
    }
  }

  function pick(picked: File, as: ImportKind = kind) {
    setFile(picked);
    setReport(null);
    void send('preview', picked, as);
  }

  const committed = report?.mode === 'commit' && problem === null;

  return (
    <Stack gap="lg" maw={1100}>
      <PageHeader
        title="Import from a spreadsheet"
        description="Upload a CSV of work entries or fuel tickets. Every row is checked first; the import then stores all rows or none, and a file sent twice adds nothing twice."
        actions={
          <Button variant="default" component={Link} to={paths.work.entries()}>
            Back to the entries
          </Button>
        }
      />
      <SegmentedControl
        aria-label="What the file holds"
        value={kind}
        onChange={(value) => {
          const next = value as ImportKind;
          setKind(next);
          if (file) pick(file, next);
        }}
        data={(['entries', 'fuel'] as const).map((k) => ({ value: k, label: KIND_LABELS[k] }))}
        disabled={transfer !== null}
      />
      <ColumnsHelp kind={kind} />
      <Dropzone
        onDrop={(files) => files[0] && pick(files[0])}
        onReject={() => setProblem(`Pick one .csv file of at most ${LIMIT_MB} MB.`)}
        accept={{ 'text/csv': ['.csv'], 'text/plain': ['.csv', '.txt'], 'application/vnd.ms-excel': ['.csv'] }}
        maxSize={IMPORT_MAX_BYTES}
        multiple={false}
        disabled={transfer !== null}
        aria-label="CSV file"
        data-testid="import-dropzone"
      >
        <Group justify="center" gap="md" mih={110} style={{ pointerEvents: 'none' }}>
          <IconFileSpreadsheet size={44} stroke={1.4} />
          <Stack gap={0}>
            <Text fw={700} size="lg">
              {file ? `${file.name}: drop another file to replace it` : 'Drop the CSV here or click to pick it'}
            </Text>
            <Text c="dimmed">
              {KIND_LABELS[kind]}, up to {LIMIT_MB} MB. The first row holds the column headers.
            </Text>
          </Stack>
        </Group>
      </Dropzone>
      {transfer && <TransferProgress transfer={transfer} />}
      {problem && (
        <Alert color="red" icon={<IconAlertTriangle />} title={report ? 'Nothing was imported' : 'The file was not read'} role="alert">
          {problem}
        </Alert>
      )}
      {committed && report && (
        <Alert color="harbor" icon={<IconCheck />} title="Imported" data-testid="import-done">
          {report.created} created, {report.skipped} skipped because they were imported before.
        </Alert>
      )}
      {report && <Counts report={report} />}
      {report && report.mode === 'preview' && file && (
        <Group>
          <Button size="lg" leftSection={<IconUpload />} disabled={!canCommit(report) || transfer !== null} onClick={() => void send('commit', file, kind)}>
            Import {rowsToCreate(report)} row{rowsToCreate(report) === 1 ? '' : 's'}
          </Button>
          {report.invalid > 0 && <Text c="red.8">Fix the rows below and upload the file again; nothing is stored while any row has an error.</Text>}
          {report.invalid === 0 && rowsToCreate(report) === 0 && <Text c="dimmed">Every row was imported before; there is nothing new.</Text>}
        </Group>
      )}
      {report && <ErrorsTable key={`${report.mode}-${report.total}-${report.invalid}`} report={report} />}
      {report && <RowsPreview report={report} />}
    </Stack>
  );
}

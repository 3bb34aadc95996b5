import { lazy, Suspense, useEffect, useState, type ReactNode } from 'react';
import { Box, Button, Center, Loader } from '@mantine/core';
import { IconPlus } from '@tabler/icons-react';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { FormGrid } from '../../../components/FormGrid';
import { PageHeader } from '../../../components/PageHeader';
import { useAfterFirstPaint } from '../../../lib/afterFirstPaint';
import type { SaveOutcome } from '../../offline/phoneQueue';
import { useEntryOptions } from '../loadEntryOptions';
import { NewEntryForm } from './NewEntryForm';

// The form comes first on a weak connection. The queue's status and list (which wait for the queue in
// IndexedDB anyway) load once the form is drawn, and so do the panels shown after a save.
const loadSavedPanel = () => import('./SavedEntryPanel');
const loadQueuedPanel = () => import('../../offline/components/QueuedPanel');
const SavedEntryPanel = lazy(() => loadSavedPanel().then((module) => ({ default: module.SavedEntryPanel })));
const QueuedPanel = lazy(() => loadQueuedPanel().then((module) => ({ default: module.QueuedPanel })));
const PhoneQueueStatus = lazy(() => import('../../offline/components/PhoneQueueStatus').then((module) => ({ default: module.PhoneQueueStatus })));
// Only a failed read shows it.
const QueryError = lazy(() => import('../../../components/QueryError').then((module) => ({ default: module.QueryError })));
const PhoneQueueList = lazy(() => import('../../offline/components/PhoneQueueList').then((module) => ({ default: module.PhoneQueueList })));

const working = (
  <Center h={240}>
    <Loader />
  </Center>
);

interface LogWorkPanelProps {
  user: SessionUser;
  /** The way to the entries list: a link inside the office app, a page load from the cab page. */
  seeEntries: ReactNode;
  onSaved?: (outcome: SaveOutcome) => void;
}

/**
 * The cab form, pass after pass, with the phone's queue under it. It needs no router and no query cache,
 * so the cab page can show it on its own (app/cab) and the office app inside its frame.
 */
export function LogWorkPanel({ user, seeEntries, onSaved }: LogWorkPanelProps) {
  const { data: options, error, retry } = useEntryOptions(user);
  const [saved, setSaved] = useState<SaveOutcome | null>(null);
  // Each pass is a fresh form with a fresh device id; the count only remounts it.
  const [pass, setPass] = useState(0);
  const painted = useAfterFirstPaint();

  useEffect(() => {
    if (!painted) return;
    void loadSavedPanel().catch(() => null);
    void loadQueuedPanel().catch(() => null);
  }, [painted]);

  const nextPass = (
    <FormGrid gap="sm">
      <Button
        size="xl"
        leftSection={<IconPlus />}
        onClick={() => {
          setSaved(null);
          setPass((n) => n + 1);
        }}
      >
        Log the next pass
      </Button>
      {seeEntries}
    </FormGrid>
  );

  return (
    <Box maw={720}>
      <PageHeader title="Log work" description="One pass: where, what, with which machines and for how long." />
      {painted && (
        <Suspense fallback={null}>
          <PhoneQueueStatus />
        </Suspense>
      )}
      {saved ? (
        <Suspense fallback={working}>
          {saved.kind === 'saved' ? <SavedEntryPanel entry={saved.entry}>{nextPass}</SavedEntryPanel> : <QueuedPanel>{nextPass}</QueuedPanel>}
        </Suspense>
      ) : error ? (
        <Suspense fallback={null}>
          <QueryError error={error} onRetry={retry} />
        </Suspense>
      ) : options ? (
        <NewEntryForm
          key={pass}
          userId={user.id}
          operatorName={user.name}
          options={options}
          onSaved={(outcome) => {
            setSaved(outcome);
            onSaved?.(outcome);
          }}
        />
      ) : (
        working
      )}
      {painted && (
        <Box mt="xl">
          <Suspense fallback={null}>
            <PhoneQueueList options={options ?? null} operatorName={user.name} />
          </Suspense>
        </Box>
      )}
    </Box>
  );
}

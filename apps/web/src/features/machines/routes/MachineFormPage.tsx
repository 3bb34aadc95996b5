import { Skeleton } from '@mantine/core';
import { useNavigate, useParams } from 'react-router-dom';
import { NotAllowed } from '../../../components/NotAllowed';
import { NotFound } from '../../../components/NotFound';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { useMachine } from '../api/getMachine';
import { CreateMachineForm, EditMachineForm } from '../components/MachineForm';

function EditMachine({ machineId }: { machineId: string }) {
  const user = useSessionUserOrThrow();
  const navigate = useNavigate();
  const machine = useMachine(machineId);
  if (machine.isError && isApiError(machine.error) && machine.error.status === 404) return <NotFound />;
  if (machine.isError) return <QueryError error={machine.error} onRetry={() => void machine.refetch()} />;
  if (machine.isPending) return <Skeleton h={400} />;
  return (
    <>
      <PageHeader title={`Edit ${machine.data.name}`} description="Owners are changed on the machine page, with the day the new shares count from." />
      <EditMachineForm
        machine={machine.data}
        role={user.role}
        onSaved={(saved) => navigate(paths.machine(saved.id))}
        onCancel={() => navigate(paths.machine(machineId))}
      />
    </>
  );
}

export function Component() {
  const { machineId } = useParams();
  const user = useSessionUserOrThrow();
  const navigate = useNavigate();
  if (accessTo(user.role, 'machines') !== 'manage') return <NotAllowed />;
  if (machineId) return <EditMachine machineId={machineId} />;
  return (
    <>
      <PageHeader title="Add a machine" description="A tractor, a self-propelled machine or an implement the family runs." />
      <CreateMachineForm role={user.role} onSaved={(saved) => navigate(paths.machine(saved.id))} onCancel={() => navigate(paths.machines())} />
    </>
  );
}

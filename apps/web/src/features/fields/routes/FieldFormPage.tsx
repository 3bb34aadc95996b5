import { Skeleton } from '@mantine/core';
import { useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { NotAllowed } from '../../../components/NotAllowed';
import { NotFound } from '../../../components/NotFound';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { useField } from '../api/getField';
import { CreateFieldForm, EditFieldForm } from '../components/FieldForm';

function EditField({ fieldId }: { fieldId: string }) {
  const navigate = useNavigate();
  const field = useField(fieldId);
  if (field.isError && isApiError(field.error) && field.error.status === 404) return <NotFound />;
  if (field.isError) return <QueryError error={field.error} onRetry={() => void field.refetch()} />;
  if (field.isPending) return <Skeleton h={400} />;
  return (
    <>
      <PageHeader title={`Edit ${field.data.name}`} description={field.data.archived ? 'Archived: kept on old entries, not offered for new work.' : undefined} />
      <EditFieldForm field={field.data} onSaved={() => navigate(paths.fields())} onCancel={() => navigate(paths.fields())} />
    </>
  );
}

export function Component() {
  const { fieldId } = useParams();
  const [searchParams] = useSearchParams();
  const user = useSessionUserOrThrow();
  const navigate = useNavigate();
  if (accessTo(user.role, 'fields') !== 'manage') return <NotAllowed />;
  if (fieldId) return <EditField fieldId={fieldId} />;
  const kind = searchParams.get('kind') === 'roadside' ? 'roadside' : 'field';
  return (
    <>
      <PageHeader
        title={kind === 'roadside' ? 'Add a road stretch' : 'Add a field'}
        description="Fields are billed by their acres; road stretches by their miles or strip acres."
      />
      <CreateFieldForm kind={kind} onSaved={() => navigate(paths.fields())} onCancel={() => navigate(paths.fields())} />
    </>
  );
}

import type { ComponentType, ReactNode } from 'react';
import { Navigate, Route, Routes } from 'react-router-dom';
import { NotAllowed } from '../components/NotAllowed';
import { NotFound } from '../components/NotFound';
import { accessTo, type AreaKey } from '../lib/areas';
import { useAuth } from '../lib/auth';
import { paths } from '../lib/paths';
import { page } from './lazyPage';

// Every page is its own chunk; the estimate pages also pull in the charting library.
const DashboardPage = page(() => import('../features/dashboard/routes/DashboardPage'));
const AccountPage = page(() => import('../features/auth/routes/AccountPage'));
const WorkEntriesPage = page(() => import('../features/work/routes/WorkEntriesPage'));
const LogWorkPage = page(() => import('../features/work/routes/LogWorkPage'));
const ImportPage = page(() => import('../features/work/routes/ImportPage'));
const EditEntryPage = page(() => import('../features/work/routes/EditEntryPage'));
const MachinesPage = page(() => import('../features/machines/routes/MachinesPage'));
const MachineFormPage = page(() => import('../features/machines/routes/MachineFormPage'));
const MachinePage = page(() => import('../features/machines/routes/MachinePage'));
const FieldsPage = page(() => import('../features/fields/routes/FieldsPage'));
const FieldFormPage = page(() => import('../features/fields/routes/FieldFormPage'));
const PartiesPage = page(() => import('../features/parties/routes/PartiesPage'));
const UsersPage = page(() => import('../features/users/routes/UsersPage'));
const AuditLogPage = page(() => import('../features/audit/routes/AuditLogPage'));
const SquareUpsPage = page(() => import('../features/square-ups/routes/SquareUpsPage'));
const StatementPage = page(() => import('../features/square-ups/routes/StatementPage'));
const YearEndPage = page(() => import('../features/reports/routes/YearEndPage'));
const MachineRatePage = page(() => import('../features/estimates/routes/MachineRatePage'));
const OwnOrHirePage = page(() => import('../features/estimates/routes/OwnOrHirePage'));
const JointOwnershipPage = page(() => import('../features/estimates/routes/JointOwnershipPage'));
const RateSheetsPage = page(() => import('../features/rate-sheets/routes/RateSheetsPage'));
const RateSheetFormPage = page(() => import('../features/rate-sheets/routes/RateSheetFormPage'));
const RateSheetPage = page(() => import('../features/rate-sheets/routes/RateSheetPage'));
const InvoicesPage = page(() => import('../features/invoices/routes/InvoicesPage'));
const NewInvoicePage = page(() => import('../features/invoices/routes/NewInvoicePage'));
const InvoicePage = page(() => import('../features/invoices/routes/InvoicePage'));
const MyInvoicesPage = page(() => import('../features/customer/routes/MyInvoicesPage'));
const MyInvoicePage = page(() => import('../features/customer/routes/MyInvoicePage'));
const PayLinkPage = page(() => import('../features/customer/routes/PayLinkPage'));

/** The navigation already hides areas a role may not open; this covers typed or old links. */
function RequireArea({ area, children }: { area: AreaKey; children: ReactNode }) {
  const { user } = useAuth();
  if (user && !accessTo(user.role, area)) return <NotAllowed />;
  return children;
}

function area(key: AreaKey, Page: ComponentType) {
  return (
    <RequireArea area={key}>
      <Page />
    </RequireArea>
  );
}

/** The signed-in pages, routed inside the signed-in frame. */
export function SignedInRoutes() {
  return (
    <Routes>
      <Route index element={<DashboardPage />} />
      <Route path={paths.account()} element={<AccountPage />} />
      <Route path={paths.work.entries()}>
        <Route index element={area('work', WorkEntriesPage)} />
        <Route path={paths.work.log()} element={area('work', LogWorkPage)} />
        <Route path={paths.work.import()} element={area('work', ImportPage)} />
        <Route path={paths.work.editEntry(':entryId')} element={area('work', EditEntryPage)} />
      </Route>
      <Route path={paths.machines()}>
        <Route index element={area('machines', MachinesPage)} />
        <Route path={paths.newMachine()} element={area('machines', MachineFormPage)} />
        <Route path={paths.machine(':machineId')} element={area('machines', MachinePage)} />
        <Route path={paths.editMachine(':machineId')} element={area('machines', MachineFormPage)} />
      </Route>
      <Route path={paths.fields()}>
        <Route index element={area('fields', FieldsPage)} />
        <Route path={paths.newField()} element={area('fields', FieldFormPage)} />
        <Route path={paths.editField(':fieldId')} element={area('fields', FieldFormPage)} />
      </Route>
      <Route path={paths.parties()} element={area('parties', PartiesPage)} />
      <Route path={paths.users()} element={area('users', UsersPage)} />
      <Route path={paths.audit()} element={area('audit', AuditLogPage)} />
      <Route path={paths.squareUps()}>
        <Route index element={area('squareUps', SquareUpsPage)} />
        <Route path={paths.squareUp(':squareUpId')} element={area('squareUps', StatementPage)} />
      </Route>
      <Route path={paths.yearEnd()} element={area('yearEnd', YearEndPage)} />
      <Route path="/estimates">
        <Route index element={<Navigate to={paths.estimates.machineRate()} replace />} />
        <Route path={paths.estimates.machineRate()} element={area('estimates', MachineRatePage)} />
        <Route path={paths.estimates.ownOrHire()} element={area('estimates', OwnOrHirePage)} />
        <Route path={paths.estimates.jointOwnership()} element={area('estimates', JointOwnershipPage)} />
      </Route>
      <Route path={paths.rateSheets()}>
        <Route index element={area('rates', RateSheetsPage)} />
        <Route path={paths.newRateSheet()} element={area('rates', RateSheetFormPage)} />
        <Route path={paths.rateSheet(':sheetId')} element={area('rates', RateSheetPage)} />
        <Route path={paths.editRateSheet(':sheetId')} element={area('rates', RateSheetFormPage)} />
      </Route>
      <Route path={paths.invoices()}>
        <Route index element={area('invoices', InvoicesPage)} />
        <Route path={paths.newInvoice()} element={area('invoices', NewInvoicePage)} />
        <Route path={paths.invoice(':invoiceId')} element={area('invoices', InvoicePage)} />
      </Route>
      <Route path={paths.myInvoices()}>
        <Route index element={area('myInvoices', MyInvoicesPage)} />
        <Route path={paths.myInvoice(':invoiceId')} element={area('myInvoices', MyInvoicePage)} />
      </Route>
      {/* The e-mail's pay link and the card checkout's way back; it sends each role to its own invoice page. */}
      <Route path={paths.payInvoice(':invoiceId')} element={<PayLinkPage />} />
      <Route path="*" element={<NotFound />} />
    </Routes>
  );
}

import { createBrowserRouter, Navigate, type RouteObject } from 'react-router-dom';
import { FullPageLoader } from '../components/FullPageLoader';
import { NotFound } from '../components/NotFound';
import { restoreSessionOnce } from '../lib/auth';
import { paths } from '../lib/paths';
import { redirectIfSignedIn, requireArea, requireSession } from './guards';
import { PublicLayout } from './layout/PublicLayout';
import { RouteErrorBoundary } from './RouteErrorBoundary';

// Every page is its own chunk; the estimate pages also pull in the charting library. The signed-in frame
// (navigation, menus) is a chunk too, so the sign-in page does not load it.
export const routes: RouteObject[] = [
  {
    id: 'root',
    loader: async () => {
      await restoreSessionOnce();
      return null;
    },
    HydrateFallback: () => <FullPageLoader />,
    errorElement: <RouteErrorBoundary />,
    children: [
      {
        element: <PublicLayout />,
        children: [
          {
            errorElement: <RouteErrorBoundary />,
            children: [
              {
                path: paths.signIn(),
                loader: redirectIfSignedIn,
                lazy: () => import('../features/auth/routes/SignInPage'),
              },
              { path: paths.forgotPassword(), lazy: () => import('../features/auth/routes/ForgotPasswordPage') },
              { path: paths.resetPassword(), lazy: () => import('../features/auth/routes/ResetPasswordPage') },
              { path: paths.acceptInvite(), lazy: () => import('../features/auth/routes/AcceptInvitePage') },
            ],
          },
        ],
      },
      {
        loader: requireSession,
        lazy: () => import('./layout/AppLayout').then(({ AppLayout }) => ({ Component: AppLayout })),
        children: [
          {
            errorElement: <RouteErrorBoundary />,
            children: [
              { index: true, lazy: () => import('../features/dashboard/routes/DashboardPage') },
              { path: paths.account(), lazy: () => import('../features/auth/routes/AccountPage') },
              {
                path: paths.work.entries(),
                loader: requireArea('work'),
                children: [
                  { index: true, lazy: () => import('../features/work/routes/WorkEntriesPage') },
                  { path: paths.work.log(), lazy: () => import('../features/work/routes/LogWorkPage') },
                  { path: paths.work.import(), lazy: () => import('../features/work/routes/ImportPage') },
                  { path: paths.work.editEntry(':entryId'), lazy: () => import('../features/work/routes/EditEntryPage') },
                ],
              },
              {
                path: paths.machines(),
                loader: requireArea('machines'),
                children: [
                  { index: true, lazy: () => import('../features/machines/routes/MachinesPage') },
                  { path: paths.newMachine(), lazy: () => import('../features/machines/routes/MachineFormPage') },
                  { path: paths.machine(':machineId'), lazy: () => import('../features/machines/routes/MachinePage') },
                  { path: paths.editMachine(':machineId'), lazy: () => import('../features/machines/routes/MachineFormPage') },
                ],
              },
              {
                path: paths.fields(),
                loader: requireArea('fields'),
                children: [
                  { index: true, lazy: () => import('../features/fields/routes/FieldsPage') },
                  { path: paths.newField(), lazy: () => import('../features/fields/routes/FieldFormPage') },
                  { path: paths.editField(':fieldId'), lazy: () => import('../features/fields/routes/FieldFormPage') },
                ],
              },
              {
                path: paths.parties(),
                loader: requireArea('parties'),
                lazy: () => import('../features/parties/routes/PartiesPage'),
              },
              {
                path: paths.users(),
                loader: requireArea('users'),
                lazy: () => import('../features/users/routes/UsersPage'),
              },
              { path: paths.audit(), loader: requireArea('audit'), lazy: () => import('../features/audit/routes/AuditLogPage') },
              {
                path: paths.squareUps(),
                loader: requireArea('squareUps'),
                children: [
                  { index: true, lazy: () => import('../features/square-ups/routes/SquareUpsPage') },
                  { path: paths.squareUp(':squareUpId'), lazy: () => import('../features/square-ups/routes/StatementPage') },
                ],
              },
              { path: paths.yearEnd(), loader: requireArea('yearEnd'), lazy: () => import('../features/reports/routes/YearEndPage') },
              {
                path: '/estimates',
                loader: requireArea('estimates'),
                children: [
                  { index: true, element: <Navigate to={paths.estimates.machineRate()} replace /> },
                  {
                    path: paths.estimates.machineRate(),
                    lazy: () => import('../features/estimates/routes/MachineRatePage'),
                  },
                  { path: paths.estimates.ownOrHire(), lazy: () => import('../features/estimates/routes/OwnOrHirePage') },
                  {
                    path: paths.estimates.jointOwnership(),
                    lazy: () => import('../features/estimates/routes/JointOwnershipPage'),
                  },
                ],
              },
              {
                path: paths.rateSheets(),
                loader: requireArea('rates'),
                children: [
                  { index: true, lazy: () => import('../features/rate-sheets/routes/RateSheetsPage') },
                  { path: paths.newRateSheet(), lazy: () => import('../features/rate-sheets/routes/RateSheetFormPage') },
                  { path: paths.rateSheet(':sheetId'), lazy: () => import('../features/rate-sheets/routes/RateSheetPage') },
                  { path: paths.editRateSheet(':sheetId'), lazy: () => import('../features/rate-sheets/routes/RateSheetFormPage') },
                ],
              },
              {
                path: paths.invoices(),
                loader: requireArea('invoices'),
                children: [
                  { index: true, lazy: () => import('../features/invoices/routes/InvoicesPage') },
                  { path: paths.newInvoice(), lazy: () => import('../features/invoices/routes/NewInvoicePage') },
                  { path: paths.invoice(':invoiceId'), lazy: () => import('../features/invoices/routes/InvoicePage') },
                ],
              },
              {
                path: paths.myInvoices(),
                loader: requireArea('myInvoices'),
                children: [
                  { index: true, lazy: () => import('../features/customer/routes/MyInvoicesPage') },
                  { path: paths.myInvoice(':invoiceId'), lazy: () => import('../features/customer/routes/MyInvoicePage') },
                ],
              },
              // The e-mail's pay link and the card checkout's way back; it sends each role to its own invoice page.
              { path: paths.payInvoice(':invoiceId'), lazy: () => import('../features/customer/routes/PayLinkPage') },
              { path: '*', element: <NotFound /> },
            ],
          },
        ],
      },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}

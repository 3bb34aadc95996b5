import { lazy, Suspense } from 'react';
import { Route, Routes } from 'react-router-dom';
import { FullPageLoader } from '../components/FullPageLoader';
import { paths } from '../lib/paths';
import { RedirectIfSignedIn, RequireSession, SessionRestored } from './guards';
import { page } from './lazyPage';
import { PublicLayout } from './layout/PublicLayout';
import { RouteErrorBoundary } from './RouteErrorBoundary';

// The declarative router: the pages need no loaders, and the data router costs the sign-in page and the
// cab form twice the router code. Only the public pages are routed here. Everything else is the signed-in
// frame's (navigation, menus, the query cache, toasts and the signed-in pages' routes), a chunk of its own.
const AppLayout = lazy(() => import('./layout/AppLayout'));
const QueryLayout = lazy(() => import('./layout/QueryLayout'));

const SignInPage = page(() => import('../features/auth/routes/SignInPage'));
const ForgotPasswordPage = page(() => import('../features/auth/routes/ForgotPasswordPage'));
const ResetPasswordPage = page(() => import('../features/auth/routes/ResetPasswordPage'));
const AcceptInvitePage = page(() => import('../features/auth/routes/AcceptInvitePage'));

export function AppRoutes() {
  return (
    <RouteErrorBoundary>
      <Suspense fallback={<FullPageLoader />}>
        <SessionRestored>
          <Routes>
            <Route element={<PublicLayout />}>
              <Route
                path={paths.signIn()}
                element={
                  <RedirectIfSignedIn>
                    <SignInPage />
                  </RedirectIfSignedIn>
                }
              />
              <Route element={<QueryLayout />}>
                <Route path={paths.forgotPassword()} element={<ForgotPasswordPage />} />
                <Route path={paths.resetPassword()} element={<ResetPasswordPage />} />
                <Route path={paths.acceptInvite()} element={<AcceptInvitePage />} />
              </Route>
            </Route>
            <Route
              path="*"
              element={
                <RequireSession>
                  <AppLayout />
                </RequireSession>
              }
            />
          </Routes>
        </SessionRestored>
      </Suspense>
    </RouteErrorBoundary>
  );
}

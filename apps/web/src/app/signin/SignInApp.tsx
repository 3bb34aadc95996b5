import { MantineProvider } from '@mantine/core';
import { Component as SignInPage } from '../../features/auth/routes/SignInPage';
import { AuthProvider } from '../../lib/auth';
import { theme } from '../../theme';
import { ErrorBoundary } from '../ErrorBoundary';
import { PublicFrame } from '../layout/PublicFrame';

/**
 * The sign-in page opened straight, as most visits start: the form in its frame, without the router and the
 * rest of the app, which the page load after signing in brings.
 */
export function SignInApp() {
  return (
    <MantineProvider theme={theme} defaultColorScheme="light">
      <AuthProvider>
        <PublicFrame>
          <ErrorBoundary>
            <SignInPage />
          </ErrorBoundary>
        </PublicFrame>
      </AuthProvider>
    </MantineProvider>
  );
}

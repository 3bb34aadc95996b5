import './lib/zod-no-eval';
import '@fontsource/lato/400.css';
import '@fontsource/lato/700.css';
import '@mantine/core/styles.css';
import '@mantine/dates/styles.css';
import '@mantine/notifications/styles.css';
import '@mantine/charts/styles.css';
import 'mantine-react-table/styles.css';
import { StrictMode, type ComponentType } from 'react';
import { createRoot } from 'react-dom/client';
import { registerServiceWorker } from './features/offline/serviceWorker';
import { currentSession, restoreSessionOnce } from './lib/auth';
import { paths } from './lib/paths';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element.');

const officeApp = () => import('./app/App').then((module) => module.App);

// Two pages are most often opened straight and on a phone: sign-in and the cab form. Each has a lean app of
// its own, fetched while the session is restored: the sign-in page for someone signed out, the cab form for
// someone who may log work. Anyone else gets the office app, which redirects or says why not.
const path = window.location.pathname.replace(/(.)\/$/, '$1');
const signInPage = path === paths.signIn() ? import('./app/signin/SignInApp') : null;
const cabPage = path === paths.work.log() ? import('./app/cab/CabApp') : null;

async function rootComponent(): Promise<ComponentType> {
  await restoreSessionOnce();
  const user = currentSession()?.user;
  const signIn = !user && signInPage ? await signInPage.catch(() => null) : null;
  if (signIn) return signIn.SignInApp;
  const cab = user && cabPage ? await cabPage.catch(() => null) : null;
  return user && cab?.mayUseCabPage(user) ? cab.CabApp : officeApp();
}

void rootComponent().then((Root) => {
  createRoot(container).render(
    <StrictMode>
      <Root />
    </StrictMode>,
  );
});

registerServiceWorker();

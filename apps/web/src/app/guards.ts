import { data, redirect, type LoaderFunctionArgs } from 'react-router-dom';
import { accessTo, type AreaKey } from '../lib/areas';
import { currentSession, restoreSessionOnce } from '../lib/auth';
import { paths } from '../lib/paths';

/** Signed-out visitors go to sign-in and come back to the page they asked for. */
export async function requireSession({ request }: LoaderFunctionArgs) {
  await restoreSessionOnce();
  if (!currentSession()) {
    const url = new URL(request.url);
    throw redirect(paths.signIn({ next: url.pathname + url.search }));
  }
  return null;
}

/** A signed-in user who opens sign-in again goes straight to the dashboard. */
export async function redirectIfSignedIn() {
  await restoreSessionOnce();
  if (currentSession()) throw redirect(paths.dashboard());
  return null;
}

/** The navigation already hides areas a role may not open; this covers typed or old links. */
export function requireArea(key: AreaKey) {
  return async () => {
    await restoreSessionOnce();
    const session = currentSession();
    if (session && !accessTo(session.user.role, key)) throw data({ area: key }, { status: 403 });
    return null;
  };
}

import { Suspense } from 'react';
import { Center, Loader } from '@mantine/core';
import { Outlet } from 'react-router-dom';
import { RouteErrorBoundary } from '../RouteErrorBoundary';
import { PublicFrame } from './PublicFrame';

/** The public pages inside the app's router: the frame around whichever of them is open. */
export function PublicLayout() {
  return (
    <PublicFrame>
      <RouteErrorBoundary>
        <Suspense
          fallback={
            <Center py="xl">
              <Loader />
            </Center>
          }
        >
          <Outlet />
        </Suspense>
      </RouteErrorBoundary>
    </PublicFrame>
  );
}

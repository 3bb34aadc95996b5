// The yardstick for the web bundle budget: the least a React + Mantine page can load.
import '@mantine/core/styles.css';
import { Button, MantineProvider } from '@mantine/core';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element.');

createRoot(container).render(
  <StrictMode>
    <MantineProvider>
      <Button>Sign in</Button>
    </MantineProvider>
  </StrictMode>,
);

import { Suspense } from 'react';
import { Box, Center, Container, Loader, Paper, Stack, Text } from '@mantine/core';
import { Outlet } from 'react-router-dom';
import { DatabaseDownNotice } from '../../components/DatabaseDownNotice';
import { RouteErrorBoundary } from '../RouteErrorBoundary';
import { Brand } from './Brand';

/** Sign-in, password reset and invitation pages: one narrow card, readable on any phone. */
export function PublicLayout() {
  return (
    <Box mih="100dvh" bg="harbor.9" py={{ base: 'md', sm: 48 }}>
      <Container size={460} px="sm">
        <Stack gap="lg">
          <Center>
            <Stack gap={4} align="center">
              <Brand />
              <Text c="harbor.1" size="sm" ta="center">
                The shared machinery ledger for farm families
              </Text>
            </Stack>
          </Center>
          <Paper p={{ base: 'md', sm: 'xl' }} radius="lg" shadow="md">
            <DatabaseDownNotice />
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
          </Paper>
        </Stack>
      </Container>
    </Box>
  );
}

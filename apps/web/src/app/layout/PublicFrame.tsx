import type { ReactNode } from 'react';
import { Anchor, Box, Center, Container, Paper, Stack, Text } from '@mantine/core';
import { DatabaseDownNotice } from '../../components/DatabaseDownNotice';
import { paths } from '../../lib/paths';
import { BrandLockup } from './BrandLockup';

/**
 * Sign-in, password reset and invitation pages: one narrow card, readable on any phone. It needs no router:
 * the sign-in page opened straight is drawn in it without the rest of the app.
 */
export function PublicFrame({ children }: { children: ReactNode }) {
  return (
    <Box mih="100dvh" bg="harbor.9" py={{ base: 'md', sm: 48 }}>
      <Container size={460} px="sm">
        <Stack gap="lg">
          <Center>
            <Stack gap={4} align="center">
              <Anchor href={paths.dashboard()} underline="never" aria-label="Hitchbook home">
                <BrandLockup />
              </Anchor>
              <Text c="harbor.1" size="sm" ta="center">
                The shared machinery ledger for farm families
              </Text>
            </Stack>
          </Center>
          <Paper p={{ base: 'md', sm: 'xl' }} radius="lg" shadow="md">
            <DatabaseDownNotice />
            {children}
          </Paper>
        </Stack>
      </Container>
    </Box>
  );
}

import { QueryClientProvider } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { createQueryClient } from '../lib/query-client';
import { handleUnauthenticated } from './session';

export interface AppProviderProps {
  children: ReactNode;
}

export function AppProvider({ children }: AppProviderProps) {
  // One client for the life of the page; created in state so a remount never loses the cache.
  const [queryClient] = useState(() => createQueryClient({ onUnauthenticated: handleUnauthenticated }));
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}

/**
 * TanStack Query for islands. Each island is its own React root, so each wraps itself in QueryRoot;
 * they share one QueryClient per page, so islands see each other's cache and invalidations.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import type { ReactNode } from 'react';

let client: QueryClient | undefined;
export function queryClient(): QueryClient {
  client ??= new QueryClient({
    defaultOptions: { queries: { staleTime: 15_000, retry: (n, e) => n < 2 && !(e as { status?: number })?.status, refetchOnWindowFocus: false } },
  });
  return client;
}

export function QueryRoot({ children }: { children: ReactNode }) {
  return <QueryClientProvider client={queryClient()}>{children}</QueryClientProvider>;
}

/**
 * TanStack Query for islands. Each island is its own React root, so each wraps itself in QueryRoot;
 * they share one QueryClient per page, so islands see each other's cache and invalidations.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState, useSyncExternalStore, type ReactNode } from 'react';

let client: QueryClient | undefined;
export function queryClient(): QueryClient {
  client ??= new QueryClient({
    defaultOptions: { queries: { staleTime: 15_000, retry: (n, e) => n < 2 && !(e as { status?: number })?.status, refetchOnWindowFocus: false } },
  });
  return client;
}

const noSubscription = () => () => {};

/**
 * While an island hydrates it must render exactly what the server rendered: its queries pending. The
 * page's shared client may already hold another island's answer for the same key (the dashboard's scene
 * table and members panel both read ['members', team]), and rendering it during hydration is a mismatch
 * (React error 418). So the server render and the hydration render use an island-own, idle client (no
 * fetching), and the island switches to the shared client right after it hydrated. Islands rendered on
 * the client only (client:only) use the shared client from the start.
 */
export function QueryRoot({ children }: { children: ReactNode }) {
  const hydrated = useSyncExternalStore(noSubscription, () => true, () => false);
  const [idle] = useState(() => new QueryClient({ defaultOptions: { queries: { enabled: false, retry: false } } }));
  return <QueryClientProvider client={hydrated ? queryClient() : idle}>{children}</QueryClientProvider>;
}

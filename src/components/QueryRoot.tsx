import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { retryRead } from '../lib/client/api.ts';

/** Gives an island its own react-query client: reads retry on 5xx, writes never retry. */
export default function QueryRoot({ children }: { children: ReactNode }) {
  const [client] = useState(
    () =>
      new QueryClient({
        defaultOptions: { queries: { retry: retryRead, staleTime: 10_000 }, mutations: { retry: false } },
      }),
  );
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}

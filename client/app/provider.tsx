import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { NoticeArea } from '../components/notice-area';

/** Everything the app needs around the router: the query client and the notice area. */
export function AppProvider({ queryClient, children }: { queryClient: QueryClient; children: ReactNode }) {
  return (
    <QueryClientProvider client={queryClient}>
      {children}
      <NoticeArea />
    </QueryClientProvider>
  );
}

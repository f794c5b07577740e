import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api.ts';

/**
 * One client for the app. Queries run even when the browser says it is offline ('offlineFirst'), so
 * the service worker can answer them from its cache; mutations fail at once offline rather than
 * wait silently, and the screen says so.
 */
export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      networkMode: 'offlineFirst',
      staleTime: 30_000,
      retry: (failures, err) => !(err instanceof ApiError && err.status < 500) && failures < 2,
    },
    mutations: { networkMode: 'always', retry: false },
  },
});

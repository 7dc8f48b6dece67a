import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { Component, lazy, Suspense, type ComponentType, type ErrorInfo, type ReactNode } from 'react';
import type { ToasterProps } from 'sonner';
import { ApiError } from '@client/lib/api-client';

// The toast library is fetched right after the first render: nothing toasts before someone acts, and a toast
// raised earlier still shows once it is mounted. If it cannot be fetched, the app goes on without toasts.
const Toaster = lazy(
  (): Promise<{ default: ComponentType<ToasterProps> }> =>
    import('sonner').then(
      (m) => ({ default: m.Toaster }),
      () => ({ default: () => null }),
    ),
);

export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      // 4xx answers will not change on retry; network blips and 5xx may.
      retry: (count, error) => !(error instanceof ApiError && error.status >= 400 && error.status < 500) && count < 2,
      refetchOnWindowFocus: true,
    },
  },
});

/** Last line of defence: a render error anywhere shows a way out instead of a blank page. */
class AppErrorBoundary extends Component<{ children: ReactNode }, { failed: boolean }> {
  state = { failed: false };
  static getDerivedStateFromError() {
    return { failed: true };
  }
  componentDidCatch(error: Error, info: ErrorInfo) {
    console.error(error, info.componentStack);
  }
  render() {
    if (!this.state.failed) return this.props.children;
    return (
      <div role="alert" className="mx-auto mt-16 max-w-md rounded-card bg-paper-raised p-6 shadow-card">
        <h1 className="text-2xl font-bold">Tenthmark hit a snag</h1>
        <p className="mt-2 text-ink-soft">The page stopped working. Reloading usually helps; nothing you saved is lost.</p>
        <button type="button" className="mt-4 font-semibold text-slate-700 underline" onClick={() => window.location.reload()}>
          Reload the page
        </button>
      </div>
    );
  }
}

export function AppProvider({ children }: { children: ReactNode }) {
  return (
    <AppErrorBoundary>
      <QueryClientProvider client={queryClient}>
        {children}
        <Suspense fallback={null}>
          <Toaster position="top-center" richColors closeButton />
        </Suspense>
      </QueryClientProvider>
    </AppErrorBoundary>
  );
}

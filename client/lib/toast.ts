import type { ExternalToast } from 'sonner';

type Message = Parameters<(typeof import('sonner'))['toast']['success']>[0];

// The toast library (about 9 KB gzipped) comes in its own chunk, which the app provider fetches right after the
// first render to mount the toaster; a page that toasts calls it through here, so the library stays out of the
// page's first load. A toast raised before the chunk arrives shows as soon as it does.
const show = (kind: 'success' | 'error') => (message: Message, data?: ExternalToast) => {
  import('sonner').then(({ toast: sonner }) => sonner[kind](message, data)).catch(() => undefined);
};

/** `toast.success('Saved.')`, `toast.error('…')`: as sonner's toast, loaded on demand. */
export const toast = { success: show('success'), error: show('error') };

import { lazyPanel } from '@client/components/lazy-panel';

// Panels of the job page that load when first shown, each in its own chunk (client/components/lazy-panel.tsx).
export const PhotoUploader = lazyPanel(() => import('./photo-uploader').then((m) => m.PhotoUploader));

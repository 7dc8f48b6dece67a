import { lazyResolver } from '@client/lib/lazy-resolver';

// The password forms' checks load with the form's first check, not with the page (client/lib/lazy-resolver.ts).
export const resetPasswordResolver = lazyResolver(() => import('./password-form-schemas').then((m) => m.resetPasswordFormSchema));
export const changePasswordResolver = lazyResolver(() => import('./password-form-schemas').then((m) => m.changePasswordFormSchema));

// The auth feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { authKeys, authQueries } from './api/auth-keys';
export { useCompleteGithub, useConfirmPasswordReset, useRequestPasswordReset, useSignOut, useVerifyEmail } from './api/auth-mutations';
export { useConfirmEmailChange } from './api/account-mutations';
export { useMe } from './api/use-me';
export { ChangeEmailForm } from './components/change-email-form';
export { ChangePasswordForm } from './components/change-password-form';
export { DeleteAccount } from './components/delete-account';
export { ExportData } from './components/export-data';
export { ConsentField } from './components/consent-field';
export { ConfirmEmailNotice, useNeedsEmailConfirmation } from './components/confirm-email-notice';
export { GithubButton } from './components/github-button';
export { HomePageLink, useHomePageName } from './components/home-page-link';
export { NewPasswordFields } from './components/new-password-fields';
export { RolePicker } from './components/role-picker';
export { SignInForm } from './components/sign-in-form';
export { SignUpForm } from './components/sign-up-form';
export { resetPasswordResolver } from './components/password-form-resolvers';
export type { ResetPasswordFormValues } from './components/password-form-schemas';

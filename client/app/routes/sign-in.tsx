import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { safeReturnPath } from '@shared/paths';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { GithubButton, SignInForm } from '@client/features/auth';
import { ContactLine } from '@client/features/help';

const githubErrors: Record<string, string> = {
  github_failed: 'The GitHub sign-in did not complete. Try again, or use your e-mail and password.',
  email_taken: 'An account with the e-mail address of that GitHub account already exists. Sign in with your password.',
  suspended: 'This account is suspended. To ask why or to have it reinstated, write to us.',
  invalid_input: 'Your GitHub account has no verified e-mail address. Add one on GitHub, or sign up with e-mail.',
};

export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const returnTo = safeReturnPath(params.get('returnTo'));
  const githubError = params.get('error');
  return (
    <div className="mx-auto max-w-md">
      <PageTitle title="Sign in" />
      <Card className="flex flex-col gap-5">
        {githubError && (
          <Notice tone="error">
            {githubErrors[githubError] ?? githubErrors.github_failed}
            {githubError === 'suspended' && <ContactLine />}
          </Notice>
        )}
        <SignInForm onSignedIn={() => navigate(returnTo, { replace: true })} />
        <div className="flex items-center gap-3 text-sm text-ink-faint" aria-hidden>
          <span className="h-px flex-1 bg-slate-200" /> or <span className="h-px flex-1 bg-slate-200" />
        </div>
        <GithubButton returnTo={returnTo} />
      </Card>
      <p className="mt-4 text-center text-sm">
        New here?{' '}
        <Link to="/signup" className="font-semibold text-slate-700 underline underline-offset-4">
          Create an account
        </Link>
      </p>
    </div>
  );
}

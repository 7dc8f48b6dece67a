import { Link, useNavigate } from 'react-router-dom';
import { Card, PageTitle } from '@client/components/ui/card';
import { GithubButton, SignUpForm } from '@client/features/auth';

export function SignUpRoute() {
  const navigate = useNavigate();
  return (
    <div className="mx-auto max-w-xl">
      <PageTitle title="Create your account" lead="One account, one role. Builders post jobs; shops bid on them." />
      <Card className="flex flex-col gap-5">
        <SignUpForm onSignedUp={() => navigate('/dashboard', { replace: true })} />
        <div className="flex items-center gap-3 text-sm text-ink-faint" aria-hidden>
          <span className="h-px flex-1 bg-slate-200" /> or <span className="h-px flex-1 bg-slate-200" />
        </div>
        <GithubButton />
      </Card>
      <p className="mt-4 text-center text-sm">
        Already have an account?{' '}
        <Link to="/signin" className="font-semibold text-slate-700 underline underline-offset-4">
          Sign in
        </Link>
      </p>
    </div>
  );
}

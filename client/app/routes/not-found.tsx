import { Link } from 'react-router-dom';
import { Card, PageTitle } from '@client/components/ui/card';

export function NotFoundRoute() {
  return (
    <div className="mx-auto max-w-lg">
      <PageTitle title="Page not found" lead="Nothing lives at this address. It may have moved, or the link may be mistyped." />
      <Card>
        <Link to="/" className="font-semibold text-slate-700 underline underline-offset-4">
          Go to the front page
        </Link>
      </Card>
    </div>
  );
}

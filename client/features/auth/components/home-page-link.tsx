import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { homePageName } from '@shared/glossary';
import { useMe } from '../api/use-me';

/** The signed-in person's home page by the name the menu gives it: "your workbench", "your shop floor". */
export function useHomePageName(): string {
  const { data: me } = useMe();
  return homePageName(me?.role);
}

/** A link to `/dashboard` worded as the menu names it: "Back to your workbench". */
export function HomePageLink({ before, className }: { before: ReactNode; className?: string }) {
  const name = useHomePageName();
  return (
    <Link to="/dashboard" className={className}>
      {before} {name}
    </Link>
  );
}

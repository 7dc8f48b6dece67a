/** A plain link: the sign-in round trip leaves the app and comes back through the API. */
export function GithubButton({ returnTo }: { returnTo?: string }) {
  const href = `/api/auth/github${returnTo ? `?returnTo=${encodeURIComponent(returnTo)}` : ''}`;
  return (
    <a
      href={href}
      className="inline-flex min-h-11 items-center justify-center gap-2 rounded-lg bg-ink px-4 py-2 font-semibold text-white hover:bg-ink-soft"
    >
      <svg aria-hidden viewBox="0 0 16 16" className="size-5 fill-current">
        <path d="M8 0a8 8 0 0 0-2.53 15.59c.4.07.55-.17.55-.38v-1.34c-2.23.48-2.7-1.07-2.7-1.07-.36-.92-.89-1.17-.89-1.17-.73-.5.05-.49.05-.49.8.06 1.23.83 1.23.83.71 1.22 1.87.87 2.33.66.07-.52.28-.87.5-1.07-1.78-.2-3.64-.89-3.64-3.95 0-.87.31-1.59.82-2.15-.08-.2-.36-1.02.08-2.12 0 0 .67-.21 2.2.82a7.6 7.6 0 0 1 4 0c1.53-1.04 2.2-.82 2.2-.82.44 1.1.16 1.92.08 2.12.51.56.82 1.28.82 2.15 0 3.07-1.87 3.75-3.65 3.95.29.25.54.73.54 1.48v2.2c0 .21.15.46.55.38A8 8 0 0 0 8 0Z" />
      </svg>
      Continue with GitHub
    </a>
  );
}

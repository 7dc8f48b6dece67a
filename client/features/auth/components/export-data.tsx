/** Downloads of what Tenthmark keeps about the person: everything as JSON, or their jobs and money lines as a CSV for a spreadsheet. */
export function ExportData() {
  const link = 'inline-flex rounded-md px-4 py-2 font-semibold text-slate-800 ring-1 ring-slate-300 hover:bg-slate-100';
  return (
    <div className="flex flex-col gap-3">
      <p className="text-ink-soft">
        Your profile, your jobs with their specifications, bids, the messages in your jobs, progress, inspection records, reviews and the money lines
        about you. Other people appear by name only.
      </p>
      <div className="flex flex-wrap gap-3">
        <a href="/api/me/export" download className={link}>
          Download everything (JSON)
        </a>
        <a href="/api/me/export.csv" download className={link}>
          Download jobs and money (CSV)
        </a>
      </div>
    </div>
  );
}

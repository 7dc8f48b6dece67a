import type { ReactNode } from 'react';
import { Card, PageTitle } from '@client/components/ui/card';
import { TERMS_EFFECTIVE } from '@shared/legal';

/** A dated page of the terms or the privacy notice: headed sections of plain paragraphs. */
export function LegalPage({ title, lead, sections }: { title: string; lead: ReactNode; sections: Array<{ heading: string; paragraphs: string[] }> }) {
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <PageTitle title={title} lead={lead} />
      <p className="text-sm text-ink-soft">In effect from {TERMS_EFFECTIVE}.</p>
      <Card>
        {sections.map((s) => (
          <section key={s.heading} className="mb-6 last:mb-0">
            <h2 className="mb-2 text-xl font-bold">{s.heading}</h2>
            {s.paragraphs.map((p) => (
              <p key={p} className="mb-2 text-ink-soft last:mb-0">
                {p}
              </p>
            ))}
          </section>
        ))}
      </Card>
    </div>
  );
}

import { Link } from 'react-router-dom';
import { Card, PageTitle } from '@client/components/ui/card';
import { GuidanceCaution } from '@client/components/ui/guidance-caution';
import { ContactLine } from '@client/features/help';

const answers: Array<{ q: string; a: string[] }> = [
  {
    q: 'How does a held payment work?',
    a: [
      'When you accept a bid you pay its total by card. Tenthmark holds the money; the shop cannot spend it yet, and you cannot lose it to a shop that does not do the work.',
      'The shop is paid, less the Tenthmark fee, when you accept its inspection record, or when the review window ends without an answer from you.',
    ],
  },
  {
    q: 'What is the review window, and what happens when it ends?',
    a: [
      'Once the shop submits its inspection record you have a set number of days to accept it, send it back with your reasons, or open a dispute. The job page shows the time left and we e-mail a reminder.',
      'If the window ends and you have done none of these, the record counts as accepted and the held money goes to the shop.',
    ],
  },
  {
    q: 'What if we disagree?',
    a: [
      'Either side can open a dispute from the job page while money is held. The other side answers, and a Tenthmark admin reads both, looks at the record and decides: the money goes to the shop, back to the builder, or is split. The decision and its reasons are sent to both of you.',
    ],
  },
  {
    q: 'What are the fees?',
    a: [
      'Builders pay the bid total and nothing more. Tenthmark keeps a fee from the shop’s payout, a percentage fixed when the bid is accepted; the bid form and the job page show the shop its fee and what it receives before it bids.',
    ],
  },
  {
    q: 'What is an inspection record?',
    a: [
      'The shop’s measurements of the finished work (bore sizes, taper, out-of-round, deck flatness and the like), checked against the limits written into the job. The page marks each figure in or out of limits.',
    ],
  },
  {
    q: 'How does shipping work?',
    a: [
      'A job says whether you drop the parts off or ship them. Once the job is paid, the shop’s receiving address is shown to the builder; the builder logs the carrier and tracking number when the parts go out, and the shop does the same on the return trip. Pack parts clean, oiled and braced, and insure them for what they are worth.',
    ],
  },
  {
    q: 'How do I change my password or e-mail address, export my data or delete my account?',
    a: ['All in Settings once you are signed in. Deleting is possible once no job or money of yours is in progress.'],
  },
];

/** Plain answers to what people ask before and during a job. */
export function HelpRoute() {
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <PageTitle title="Help" lead="Short answers about paying, reviewing, disputes, fees, inspection records and shipping." />
      {answers.map(({ q, a }) => (
        <Card key={q}>
          <h2 className="mb-2 text-xl font-bold">{q}</h2>
          {a.map((p) => (
            <p key={p} className="mb-2 text-ink-soft last:mb-0">
              {p}
            </p>
          ))}
          {q.startsWith('What is an inspection record') && <GuidanceCaution className="mt-3" />}
        </Card>
      ))}
      <Card>
        <h2 className="mb-2 text-xl font-bold">How do I reach Tenthmark’s people?</h2>
        <p className="mb-2 text-ink-soft">By e-mail, signed in or not: a suspended account, a payment that went wrong, anything these answers do not cover. Our mail is sent from an address that takes no replies, so write to this one.</p>
        <ContactLine withHelpLink={false} />
      </Card>
      <p className="text-ink-soft">
        More detail: the <Link to="/terms" className="underline">terms of use</Link> and the <Link to="/privacy" className="underline">privacy notice</Link>.
      </p>
    </div>
  );
}

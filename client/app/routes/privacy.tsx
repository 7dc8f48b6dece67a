import { LegalPage } from '@client/components/legal-page';

const sections = [
  {
    heading: 'What we keep',
    paragraphs: [
      'Your account: name or business name, e-mail address, role, a hash of your password (never the password itself), whether you sign in with GitHub, and when you accepted these terms.',
      'Your work on Tenthmark: jobs and their specifications, photos, bids, messages, progress notes, inspection records, disputes and reviews. For shops, the shop profile and prices.',
      'Payments: amounts, dates and the payment provider’s references. Card details go to the payment provider and never reach us.',
    ],
  },
  {
    heading: 'Why',
    paragraphs: [
      'To run jobs between builders and shops, to hold and pay out money, to settle disputes, to keep the books the law asks for, and to stop abuse. We do not sell your data or show advertising.',
    ],
  },
  {
    heading: 'Who sees what',
    paragraphs: [
      'The other party to a job sees your name, the job, your messages in it and its records. Your e-mail address is not shown to other people. Shop profiles and reviews are public. Tenthmark admins see what they need to settle disputes and keep the service safe.',
    ],
  },
  {
    heading: 'How long',
    paragraphs: [
      'While your account is open. When you delete it, your name, e-mail address, password and sessions are removed at once. Jobs, records, reviews and money records stay under the name “Deleted account”, because the other party and the books still need them; money records are kept as long as tax and accounting law requires.',
    ],
  },
  {
    heading: 'Your data, your way',
    paragraphs: [
      'In Settings you can download everything we keep about you (JSON, and a CSV of your jobs and money), change your e-mail address and password, and delete your account.',
    ],
  },
  {
    heading: 'E-mail',
    paragraphs: [
      'We e-mail you about your account (confirming your address, resetting your password) and about your jobs (bids, payments, records, disputes). You can choose which job notices also come by e-mail in Settings; account and money notices always come.',
    ],
  },
  {
    heading: 'Cookies',
    paragraphs: ['Only one: the session cookie that keeps you signed in. No tracking or advertising cookies, and no analytics that follow you.'],
  },
];

export function PrivacyRoute() {
  return <LegalPage title="Privacy notice" lead="What Tenthmark keeps about you, why, for how long, and what you can do about it." sections={sections} />;
}

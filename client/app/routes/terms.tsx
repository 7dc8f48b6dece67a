import { LegalPage } from '@client/components/legal-page';

const sections = [
  {
    heading: 'What Tenthmark is',
    paragraphs: [
      'Tenthmark is a marketplace where engine builders post machining jobs, machine shops bid on them, and the work is paid through a held payment released when the builder accepts the shop’s inspection record.',
      'Tenthmark is not a party to the work itself. The agreement about the work is between the builder and the shop, on the terms of the job and the accepted bid.',
    ],
  },
  {
    heading: 'Your account',
    paragraphs: [
      'Give your real name or business name and an e-mail address you read. Keep your password to yourself; you are responsible for what is done with your account.',
      'An account is either a builder or a shop. We may suspend an account that misleads others, does not pay, does not deliver, or misuses the service, and we tell you why.',
    ],
  },
  {
    heading: 'Jobs, bids and payment',
    paragraphs: [
      'A builder describes the work and its limits truthfully. A shop bids only on work it can do to those limits, within the time it states.',
      'When a builder accepts a bid and pays, Tenthmark holds the money. It goes to the shop, less the Tenthmark fee, when the builder accepts the inspection record or the review window ends without an answer; it goes back to the builder if the job is cancelled before work starts or a dispute decides so.',
      'Fees are shown before a bid is placed and fixed when it is accepted.',
    ],
  },
  {
    heading: 'Disputes',
    paragraphs: [
      'While money is held, either side may open a dispute. A Tenthmark admin reads both sides and the record and decides how the held money is paid out. That decision settles the money held on Tenthmark; it does not take away any right you have under the law.',
    ],
  },
  {
    heading: 'Figures are guidance',
    paragraphs: [
      'Calculators, limits and checks on Tenthmark are guidance. Engine and piston makers’ specifications, calibrated instruments, local codes and licensed practice govern machine work. The shop remains responsible for its measurements.',
    ],
  },
  {
    heading: 'Ending your account',
    paragraphs: [
      'You may delete your account in Settings once no job or money of yours is in progress. What happens to your data is described in the privacy notice.',
      'When these terms change in substance we change the date above and ask you to accept them again.',
    ],
  },
];

export function TermsRoute() {
  return <LegalPage title="Terms of use" lead="The rules for builders and shops using Tenthmark, in plain words." sections={sections} />;
}

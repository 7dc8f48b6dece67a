import { Link } from 'react-router-dom';
import { useContact } from '../api/contact';

/** How to reach Tenthmark's people: the support address (once known) and, unless already there, the help page. */
export function ContactLine({ withHelpLink = true }: { withHelpLink?: boolean }) {
  const contact = useContact();
  const email = contact.data?.email;
  return (
    <p className="text-sm" data-testid="contact-line">
      {email ? (
        <>
          Write to{' '}
          <a href={`mailto:${email}`} className="font-semibold underline underline-offset-4">
            {email}
          </a>
          .
        </>
      ) : (
        'Write to us by e-mail.'
      )}
      {withHelpLink && (
        <>
          {' '}
          The{' '}
          <Link to="/help" className="font-semibold underline underline-offset-4">
            help page
          </Link>{' '}
          answers the common questions.
        </>
      )}
    </p>
  );
}

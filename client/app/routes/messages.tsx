import { PageTitle } from '@client/components/ui/card';
import { ConversationList } from '@client/features/messages';

/** Every conversation of the signed-in builder or shop, newest first, with what is unread. */
export function MessagesRoute() {
  return (
    <div className="mx-auto max-w-3xl">
      <PageTitle title="Messages" lead="Your conversations about jobs, newest first. Open one to read and answer it on the job’s page." />
      <ConversationList />
    </div>
  );
}

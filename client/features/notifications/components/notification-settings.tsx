import { useEffect, useState } from 'react';
import { toast } from '@client/lib/toast';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { CheckboxField } from '@client/components/ui/checkbox-field';
import { Notice } from '@client/components/ui/notice';
import { useNotificationPreferences, useSaveNotificationPreferences } from '../api/notifications';

/**
 * Which e-mails the person gets, one switch per kind. Receipts, dispute
 * decisions and the account's own mail always go and show as such; every
 * notice still appears in the notification centre whatever is chosen here.
 * Self-contained, so a settings page can mount it as one section.
 */
export function NotificationSettings() {
  const prefs = useNotificationPreferences();
  const [choices, setChoices] = useState<Record<string, boolean>>({});
  useEffect(() => {
    if (prefs.data) setChoices(Object.fromEntries(prefs.data.map((p) => [p.kind, p.email])));
  }, [prefs.data]);
  const save = useSaveNotificationPreferences({
    mutationConfig: { onSuccess: () => toast.success('Your e-mail choices are saved.'), onError: (error) => toast.error(error.message) },
  });
  if (prefs.isPending) return <p className="text-ink-soft">Loading your e-mail choices …</p>;
  if (prefs.isError)
    return (
      <Notice tone="error" title="Your e-mail choices could not be loaded.">
        <Button variant="secondary" className="mt-2" onClick={() => void prefs.refetch()}>
          Retry
        </Button>
      </Notice>
    );
  return (
    <Card>
      <form
        aria-labelledby="email-choices-heading"
        onSubmit={(event) => {
          event.preventDefault();
          save.mutate({ preferences: prefs.data.filter((p) => p.canTurnOff).map((p) => ({ kind: p.kind, email: choices[p.kind] ?? true })) });
        }}
      >
        <h2 id="email-choices-heading" className="text-xl font-bold">
          E-mail notices
        </h2>
        <p className="mt-1 text-ink-soft">Choose what we e-mail you about. Everything still shows under the bell in the app.</p>
        <div className="mt-4 flex flex-col gap-3">
          {prefs.data.map((p) => (
            <CheckboxField
              key={p.kind}
              name={p.kind}
              label={p.label}
              hint={p.canTurnOff ? undefined : 'Always sent: you need these whatever you choose.'}
              checked={p.canTurnOff ? (choices[p.kind] ?? true) : true}
              disabled={!p.canTurnOff}
              onChange={(event) => setChoices((current) => ({ ...current, [p.kind]: event.target.checked }))}
            />
          ))}
        </div>
        <Button type="submit" className="mt-5" busy={save.isPending}>
          Save e-mail choices
        </Button>
      </form>
    </Card>
  );
}

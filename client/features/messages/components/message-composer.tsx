import { forwardRef, useId, useState, type FormEvent, type KeyboardEvent } from 'react';
import { MAX_MESSAGE_LENGTH, sendMessageSchema } from '@shared/schemas/messages';
import { Button } from '@client/components/ui/button';
import { FieldFrame, inputBorder, useFieldIds } from '@client/components/ui/field-frame';
import { cn } from '@client/lib/cn';
import { COUNTER_FROM, remainingWords } from './message-words';

export interface MessageComposerProps {
  /** Who reads it, for the label: "Message to Lantern Hill Machine Works". */
  recipientName: string;
  /** Called with the checked, trimmed text; the message is queued at once. */
  onSend: (body: string) => void;
  /** Called as the person types (the caller throttles what it tells the server). */
  onTyping?: () => void;
}

/**
 * Where a message is written: Enter sends, Shift+Enter starts a new line; a
 * counter shows near the limit, and the shared schema's words show beside
 * the field when the text cannot be sent.
 */
export const MessageComposer = forwardRef<HTMLTextAreaElement, MessageComposerProps>(function MessageComposer(
  { recipientName, onSend, onTyping },
  ref,
) {
  const [body, setBody] = useState('');
  const [error, setError] = useState<string | undefined>();
  const hintId = useId();
  const length = body.trim().length;
  const showCounter = length >= COUNTER_FROM;
  // The hint (or, near the limit, the counter) sits beside the Send button rather than under the field.
  const ids = useFieldIds({ error, extra: hintId });

  const submit = (event?: FormEvent) => {
    event?.preventDefault();
    const parsed = sendMessageSchema.shape.body.safeParse(body);
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message ?? 'Write a message.');
      return;
    }
    onSend(parsed.data);
    setBody('');
    setError(undefined);
  };

  const onKeyDown = (event: KeyboardEvent<HTMLTextAreaElement>) => {
    if (event.key !== 'Enter' || event.shiftKey || event.altKey || event.ctrlKey || event.metaKey || event.nativeEvent.isComposing) return;
    event.preventDefault();
    submit();
  };

  return (
    <form onSubmit={submit} aria-label={`Write to ${recipientName}`} className="flex flex-col gap-2" noValidate>
      <FieldFrame label={`Message to ${recipientName}`} error={error} {...ids}>
        <textarea
          ref={ref}
          id={ids.inputId}
          rows={3}
          value={body}
          onChange={(event) => {
            setBody(event.target.value);
            if (error) setError(undefined);
            if (event.target.value.trim()) onTyping?.();
          }}
          onKeyDown={onKeyDown}
          aria-invalid={error ? true : undefined}
          aria-describedby={ids.describedBy}
          className={cn('min-h-20 resize-y rounded-lg border bg-white px-3 py-2 text-base text-ink placeholder:text-ink-faint', inputBorder(error))}
          placeholder="Ask about the work, the parts or the timing"
        />
      </FieldFrame>
      <div className="flex flex-wrap items-center justify-between gap-3">
        {showCounter ? (
          <p id={hintId} className={cn('text-sm tabular-nums', length > MAX_MESSAGE_LENGTH ? 'font-semibold text-fail' : 'text-ink-soft')} data-testid="message-counter">
            {remainingWords(length)}
          </p>
        ) : (
          <p id={hintId} className="text-sm text-ink-faint">
            Enter sends. Shift+Enter starts a new line.
          </p>
        )}
        <Button type="submit" className="ml-auto">
          Send
        </Button>
      </div>
    </form>
  );
});

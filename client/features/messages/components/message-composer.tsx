import { forwardRef, useId, useState, type FormEvent, type KeyboardEvent } from 'react';
import { messageContentSchema, type MessagePhoto } from '@shared/schemas/messages';
import { MAX_MESSAGE_LENGTH, MAX_PHOTOS_PER_MESSAGE } from '@shared/schemas/values';
import { Button } from '@client/components/ui/button';
import { FieldFrame, inputBorder, useFieldIds } from '@client/components/ui/field-frame';
import { AddPhotosButton, PendingPhotoList, type PendingUpload } from '@client/components/ui/pending-photo-tile';
import { usePendingUploads } from '@client/hooks/use-pending-uploads';
import { cn } from '@client/lib/cn';
import { messagePhotoTarget } from '../api/photos';
import { COUNTER_FROM, remainingWords } from './message-words';

type Attachment = PendingUpload<MessagePhoto>;

export interface MessageComposerProps {
  /** The conversation the photos are uploaded to. */
  threadId: string;
  /** Who reads it, for the label: "Message to Lantern Hill Machine Works". */
  recipientName: string;
  /** Called with the checked, trimmed text and the uploaded photos; the message is queued at once. */
  onSend: (body: string, photos: MessagePhoto[]) => void;
  /** Called as the person types (the caller throttles what it tells the server). */
  onTyping?: () => void;
}

/**
 * Where a message is written: Enter sends, Shift+Enter starts a new line; a
 * counter shows near the limit, and the shared schema's words show beside
 * the field when the text cannot be sent. Photos are checked here, uploaded
 * at once (each with its progress), shown as thumbnails that can be removed,
 * and go out with the message by id.
 */
export const MessageComposer = forwardRef<HTMLTextAreaElement, MessageComposerProps>(function MessageComposer(
  { threadId, recipientName, onSend, onTyping },
  ref,
) {
  const [body, setBody] = useState('');
  const [error, setError] = useState<string | undefined>();
  const [attachments, setAttachments] = useState<Attachment[]>([]);
  const hintId = useId();
  const length = body.trim().length;
  const showCounter = length >= COUNTER_FROM;
  // The hint (or, near the limit, the counter) sits beside the Send button rather than under the field.
  const ids = useFieldIds({ error, extra: hintId });

  const photos = usePendingUploads(attachments, setAttachments, messagePhotoTarget(threadId));
  const addPhotos = (files: File[]) => {
    photos.add(files);
    if (files.length > 0 && error) setError(undefined);
  };

  const submit = (event?: FormEvent) => {
    event?.preventDefault();
    if (photos.uploading) {
      photos.setNotice('Wait for the photos to finish uploading, then send.');
      return;
    }
    const parsed = messageContentSchema.safeParse({ body, photoIds: photos.ready.map((p) => p.id) });
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message ?? 'Write a message or add a photo.');
      return;
    }
    onSend(parsed.data.body, photos.ready);
    setBody('');
    setAttachments([]);
    photos.setNotice(undefined);
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

      <PendingPhotoList
        uploads={attachments}
        label="Photos to send"
        testId="composer-photos"
        alt={(name) => `Photo to send: ${name}`}
        imageTestId="composer-photo-thumb"
        onRemove={photos.remove}
        notice={photos.notice}
      />

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
        <div className="ml-auto flex items-center gap-2">
          <AddPhotosButton
            inputTestId="photo-input"
            disabled={photos.full}
            onFiles={addPhotos}
            hintClassName="sr-only"
            hint={<>JPEG, PNG or WebP, up to 15 MB each, {MAX_PHOTOS_PER_MESSAGE} per message. Location and camera details are removed.</>}
          />
          <Button type="submit">
            Send
          </Button>
        </div>
      </div>
    </form>
  );
});

import { forwardRef, useEffect, useId, useRef, useState, type FormEvent, type KeyboardEvent } from 'react';
import { MAX_MESSAGE_LENGTH, MAX_PHOTOS_PER_MESSAGE, messageContentSchema, type MessagePhoto } from '@shared/schemas/messages';
import { Button } from '@client/components/ui/button';
import { FieldFrame, inputBorder, useFieldIds } from '@client/components/ui/field-frame';
import { PendingPhotoTile, type PendingUpload, megabytes } from '@client/components/ui/pending-photo-tile';
import { ApiError } from '@client/lib/api-client';
import { cn } from '@client/lib/cn';
import { ACCEPTED_PHOTO_TYPES, MAX_PHOTO_BYTES, uploadMessagePhoto } from '../api/photos';
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
  const [photoNotice, setPhotoNotice] = useState<string | undefined>();
  const hintId = useId();
  const fileInput = useRef<HTMLInputElement>(null);
  const photoHintId = useId();
  const nextKey = useRef(0);
  const length = body.trim().length;
  const showCounter = length >= COUNTER_FROM;
  // The hint (or, near the limit, the counter) sits beside the Send button rather than under the field.
  const ids = useFieldIds({ error, extra: hintId });

  // Leaving the conversation stops uploads still on their way.
  const live = useRef<Attachment[]>([]);
  live.current = attachments;
  useEffect(() => () => live.current.forEach((a) => a.controller.abort()), []);

  const update = (key: number, change: Partial<Attachment>) => setAttachments((all) => all.map((a) => (a.key === key ? { ...a, ...change } : a)));
  const counted = attachments.filter((a) => a.status !== 'failed').length;
  const uploading = attachments.some((a) => a.status === 'uploading');
  const ready = attachments.filter((a) => a.status === 'done' && a.photo).map((a) => a.photo!);

  const addPhotos = (files: File[]) => {
    if (files.length === 0) return;
    const refused: string[] = [];
    const fresh: Array<{ attachment: Attachment; file: File }> = [];
    let room = MAX_PHOTOS_PER_MESSAGE - counted;
    for (const file of files) {
      if (!ACCEPTED_PHOTO_TYPES.includes(file.type)) refused.push(`“${file.name}” is not a JPEG, PNG or WebP photo.`);
      else if (file.size > MAX_PHOTO_BYTES) refused.push(`“${file.name}” is ${megabytes(file.size)}; each photo may be at most 15 MB.`);
      else if (room <= 0) refused.push(`“${file.name}” was left out: a message can carry at most ${MAX_PHOTOS_PER_MESSAGE} photos.`);
      else {
        room -= 1;
        fresh.push({ attachment: { key: nextKey.current++, name: file.name, status: 'uploading', progress: 0, controller: new AbortController() }, file });
      }
    }
    setPhotoNotice(refused.length ? refused.join(' ') : undefined);
    setAttachments((all) => [...all, ...fresh.map((f) => f.attachment)]);
    if (error) setError(undefined);
    for (const { attachment, file } of fresh) {
      uploadMessagePhoto(threadId, file, (fraction) => update(attachment.key, { progress: fraction }), attachment.controller.signal).then(
        (photo) => update(attachment.key, { status: 'done', progress: 1, photo }),
        (failure: unknown) => {
          if (attachment.controller.signal.aborted) return;
          update(attachment.key, { status: 'failed', error: failure instanceof ApiError ? failure.message : 'The upload failed. Try again.' });
        },
      );
    }
  };

  const removeAttachment = (attachment: Attachment) => {
    attachment.controller.abort();
    setAttachments((all) => all.filter((a) => a.key !== attachment.key));
  };

  const submit = (event?: FormEvent) => {
    event?.preventDefault();
    if (uploading) {
      setPhotoNotice('Wait for the photos to finish uploading, then send.');
      return;
    }
    const parsed = messageContentSchema.safeParse({ body, photoIds: ready.map((p) => p.id) });
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message ?? 'Write a message or add a photo.');
      return;
    }
    onSend(parsed.data.body, ready);
    setBody('');
    setAttachments([]);
    setPhotoNotice(undefined);
    setError(undefined);
  };

  const onKeyDown = (event: KeyboardEvent<HTMLTextAreaElement>) => {
    if (event.key !== 'Enter' || event.shiftKey || event.altKey || event.ctrlKey || event.metaKey || event.nativeEvent.isComposing) return;
    event.preventDefault();
    submit();
  };

  const full = counted >= MAX_PHOTOS_PER_MESSAGE;

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

      {attachments.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Photos to send" data-testid="composer-photos">
          {attachments.map((attachment) => (
            <PendingPhotoTile
              key={attachment.key}
              upload={attachment}
              alt={`Photo to send: ${attachment.name}`}
              imageTestId="composer-photo-thumb"
              onRemove={() => removeAttachment(attachment)}
            />
          ))}
        </ul>
      )}
      {photoNotice && (
        <p className="text-sm font-semibold text-fail" role="alert">
          {photoNotice}
        </p>
      )}

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
          <input
            ref={fileInput}
            type="file"
            multiple
            accept={ACCEPTED_PHOTO_TYPES.join(',')}
            hidden
            tabIndex={-1}
            data-testid="photo-input"
            onChange={(event) => {
              addPhotos([...(event.target.files ?? [])]);
              event.target.value = '';
            }}
          />
          <Button variant="secondary" disabled={full} aria-describedby={photoHintId} onClick={() => fileInput.current?.click()}>
            Add photos
          </Button>
          <span id={photoHintId} className="sr-only">
            JPEG, PNG or WebP, up to 15 MB each, {MAX_PHOTOS_PER_MESSAGE} per message. Location and camera details are removed.
          </span>
          <Button type="submit">
            Send
          </Button>
        </div>
      </div>
    </form>
  );
});

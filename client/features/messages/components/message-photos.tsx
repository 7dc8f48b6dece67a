import type { MessagePhoto } from '@shared/schemas/messages';
import { PhotoThumbnails } from '@client/components/ui/photo-thumbnails';

export interface MessagePhotosProps {
  photos: MessagePhoto[];
  /** Who sent them, for the full-size view's words: "Photo 1 of 2 from Lantern Hill Machine Works". */
  authorName: string;
}

/** A message's photos as thumbnails; each opens full size. */
export function MessagePhotos({ photos, authorName }: MessagePhotosProps) {
  return (
    <PhotoThumbnails photos={photos} thumbClassName="size-28" testId="message-photo" nameOf={(index, count) => `Photo ${index + 1} of ${count} from ${authorName}`} />
  );
}

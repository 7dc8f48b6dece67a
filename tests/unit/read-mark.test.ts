import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';
import type { Message, ThreadSummary } from '../../shared/schemas/messages';
import { liveReadMark, otherReadIndex, setOtherRead } from '../../client/features/messages/api/threads';
import { threadKeys } from '../../client/lib/query-keys';

const THREAD = '00000000-0000-4000-8000-000000000001';
const ME = '00000000-0000-4000-8000-0000000000a1';
const ids = ['00000000-0000-4000-8000-00000000f001', '00000000-0000-4000-8000-00000000f002', '00000000-0000-4000-8000-00000000f003'];

const summary = (otherLastReadMessageId: string | null): ThreadSummary => ({
  id: THREAD,
  jobId: '00000000-0000-4000-8000-0000000000b1',
  jobTitle: 'Bore and hone a V8 block',
  shop: { id: '00000000-0000-4000-8000-0000000000c1', name: 'A shop' },
  builder: { id: ME, displayName: 'A builder' },
  lastMessageAt: null,
  unread: 0,
  canWrite: true,
  otherLastReadMessageId,
});
/** Oldest first, as a conversation reads. */
const delivered: Message[] = ids.map((id, i) => ({
  id,
  threadId: THREAD,
  clientId: `c${i}`,
  author: { id: ME, displayName: 'A builder', role: 'builder' },
  body: `message ${i}`,
  photos: [],
  createdAt: new Date(Date.UTC(2026, 11, 5, 12, i)).toISOString(),
}));

describe('where the other person has read to', () => {
  it('stays at a live read receipt when a list fetched before it lands after it', async () => {
    const queryClient = new QueryClient();
    queryClient.setQueryData(threadKeys.mine(), [summary(ids[0])]);
    // A new message invalidated the lists; their refetch left before the other person read it …
    let answer!: (threads: ThreadSummary[]) => void;
    const refetch = queryClient.fetchQuery({
      queryKey: threadKeys.mine(),
      queryFn: () => new Promise<ThreadSummary[]>((resolve) => (answer = resolve)),
    });
    // … the receipt arrives live …
    setOtherRead(queryClient, THREAD, ids[2]);
    // … and then the list, as the server saw it before the receipt.
    answer([summary(ids[0])]);
    await refetch;

    const listed = queryClient.getQueryData<ThreadSummary[]>(threadKeys.mine())![0];
    expect(otherReadIndex(delivered, listed.otherLastReadMessageId, liveReadMark(queryClient, THREAD))).toBe(2);
  });

  it('takes the list when it is the later of the two, and -1 when neither is loaded', () => {
    expect(otherReadIndex(delivered, ids[1], ids[0])).toBe(1);
    expect(otherReadIndex(delivered, null, undefined)).toBe(-1);
    expect(otherReadIndex(delivered, '00000000-0000-4000-8000-00000000ffff', undefined)).toBe(-1);
  });
});

import { useMessagesLive } from '../api/live';

/** Mounted once for a signed-in person (inside RealtimeProvider): live conversation events and the outgoing queue. */
export function MessagesLive() {
  useMessagesLive();
  return null;
}

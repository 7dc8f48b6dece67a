import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { useSearchParams } from 'react-router-dom';
import { BID_STATUS } from '@shared/glossary';
import type { JobStatus } from '@shared/schemas/jobs';
import type { ThreadSummary } from '@shared/schemas/messages';
import { Badge } from '@client/components/ui/badge';
import { Button } from '@client/components/ui/button';
import { Notice } from '@client/components/ui/notice';
import { cn } from '@client/lib/cn';
import { useRealtimeUserId } from '@client/lib/realtime';
import { useJobThreads, useLatestMessage, useOpenThread } from '../api/threads';
import { ConversationView } from './conversation-view';
import { messageTime, photoCountWords, unreadWords } from './message-words';

/** A shop that bid on the job, as the job page already knows it from the bids. */
export interface Bidder {
  shopId: string;
  name: string;
  /** The shop's latest bid on this job. */
  bidStatus: 'active' | 'accepted' | 'declined' | 'withdrawn';
}

export type ConversationPanelProps =
  | { side: 'builder'; jobId: string; jobStatus: JobStatus; bidders: Bidder[] }
  | { side: 'shop'; jobId: string; jobStatus: JobStatus };

/** The URL remembers which conversation is open (?thread=…), so a link from the messages page opens it. */
function useOpenThreadParam() {
  const [params, setParams] = useSearchParams();
  const current = params.get('thread');
  const choose = (threadId: string | null) =>
    setParams(
      (prev) => {
        const next = new URLSearchParams(prev);
        if (threadId) next.set('thread', threadId);
        else next.delete('thread');
        return next;
      },
      { replace: true, preventScrollReset: true },
    );
  return [current, choose] as const;
}

/** Arriving from a link that names a conversation (?thread=…): bring the panel into view, once. */
function useBringIntoView(arrivedWithThread: boolean) {
  const done = useRef(false);
  useEffect(() => {
    if (!arrivedWithThread || done.current) return;
    done.current = true;
    document.getElementById('conversations')?.scrollIntoView({ block: 'start' });
  }, [arrivedWithThread]);
}

function PanelFrame({ title, lead, children, id, headingId: givenId }: { title: string; lead: ReactNode; children: ReactNode; id?: string; headingId?: string }) {
  const autoId = useId();
  const headingId = givenId ?? autoId;
  return (
    <section id={id} aria-labelledby={headingId} className="flex scroll-mt-4 flex-col gap-4 rounded-card bg-paper-raised p-6 shadow-card ring-1 ring-slate-100" data-testid="conversation-panel">
      <div className="flex flex-col gap-1">
        <h2 id={headingId} className="text-xl font-bold tracking-tight">
          {title}
        </h2>
        <p className="text-ink-soft">{lead}</p>
      </div>
      {children}
    </section>
  );
}

/** The newest message of a conversation in one line, for the list of shops. */
function LatestLine({ threadId }: { threadId: string }) {
  const me = useRealtimeUserId();
  const { data: latest } = useLatestMessage(threadId);
  if (!latest) return <span className="text-sm text-ink-soft">No messages yet</span>;
  return (
    <span className="flex min-w-0 items-baseline gap-2 text-sm">
      <span className="min-w-0 truncate text-ink" data-testid="latest-message">
        {latest.author.id === me ? 'You: ' : ''}
        {latest.body || photoCountWords(latest.photos?.length ?? 0)}
      </span>
      <time dateTime={latest.createdAt} className="shrink-0 text-ink-soft">
        {messageTime(latest.createdAt)}
      </time>
    </span>
  );
}

const bidWords = (status: Bidder['bidStatus']) => `Bid ${BID_STATUS[status].label.toLowerCase()}`;

interface ShopRow {
  shopId: string;
  name: string;
  thread?: ThreadSummary;
  bidStatus?: Bidder['bidStatus'];
}

/** The shops a builder can talk with about this job: those with a conversation (newest first), then bidders not yet written to. */
function shopRows(threads: ThreadSummary[], bidders: Bidder[]): ShopRow[] {
  const bidStatus = new Map(bidders.map((b) => [b.shopId, b.bidStatus]));
  const rows: ShopRow[] = threads.map((thread) => ({ shopId: thread.shop.id, name: thread.shop.name, thread, bidStatus: bidStatus.get(thread.shop.id) }));
  const seen = new Set(rows.map((r) => r.shopId));
  for (const bidder of bidders) {
    if (seen.has(bidder.shopId)) continue;
    seen.add(bidder.shopId);
    rows.push({ shopId: bidder.shopId, name: bidder.name, bidStatus: bidder.bidStatus });
  }
  return rows;
}

function BuilderPanel({ jobId, jobStatus, bidders }: { jobId: string; jobStatus: JobStatus; bidders: Bidder[] }) {
  const threads = useJobThreads(jobId);
  const [openId, setOpenId] = useOpenThreadParam();
  const [chosenHere, setChosenHere] = useState(false);
  const open = useOpenThread(jobId, {
    mutationConfig: {
      onSuccess: (thread) => {
        setChosenHere(true);
        setOpenId(thread.id);
      },
    },
  });
  const [opening, setOpening] = useState<string | null>(null);

  const list = threads.data ?? [];
  const selected = list.find((t) => t.id === openId);

  useBringIntoView(Boolean(selected) && !chosenHere);

  const rows = shopRows(list, bidders);
  const acceptsNew = jobStatus === 'open';

  return (
    <PanelFrame
      id="conversations"
      title="Conversations with shops"
      lead="Ask a shop about its bid before you choose. Each conversation is private between you and that shop."
    >
      {threads.isPending && <p className="text-ink-soft">Loading the conversations …</p>}
      {threads.isError && !threads.data && (
        <Notice tone="error" title="The conversations could not be loaded" onRetry={() => void threads.refetch()}>
          {threads.error.message}
        </Notice>
      )}
      {threads.data && rows.length === 0 && <p className="text-ink-soft">When shops bid or ask a question, you can write to them here.</p>}
      {open.error && <Notice tone="error">{open.error.message}</Notice>}
      {rows.length > 0 && (
        <div className="grid grid-cols-1 items-start gap-5 lg:grid-cols-[minmax(0,19rem)_minmax(0,1fr)]">
          <ul aria-label="Shops on this job" className="flex flex-col gap-2">
            {rows.map((row) => {
              const isOpen = row.thread && row.thread.id === selected?.id;
              const canStart = !row.thread && (acceptsNew ? row.bidStatus !== 'withdrawn' : row.bidStatus === 'accepted');
              return (
                <li key={row.shopId} data-testid="conversation-row" data-shop-id={row.shopId}>
                  {row.thread ? (
                    <button
                      type="button"
                      aria-current={isOpen ? 'true' : undefined}
                      onClick={() => {
                        setChosenHere(true);
                        setOpenId(row.thread!.id);
                      }}
                      className={cn(
                        'flex w-full min-w-0 flex-col gap-1 rounded-lg px-3 py-2 text-left ring-1 transition-colors',
                        isOpen ? 'bg-slate-50 ring-2 ring-slate-700' : 'bg-white ring-slate-200 hover:bg-slate-50',
                      )}
                    >
                      <span className="flex items-center justify-between gap-2">
                        <span className="min-w-0 truncate font-bold text-ink">{row.name}</span>
                        {row.thread.unread > 0 && (
                          <Badge tone="info" className="shrink-0">
                            <span data-testid="row-unread">{unreadWords(row.thread.unread)}</span>
                          </Badge>
                        )}
                      </span>
                      <LatestLine threadId={row.thread.id} />
                      {row.bidStatus && <span className="text-xs text-ink-soft">{bidWords(row.bidStatus)}</span>}
                    </button>
                  ) : (
                    <div className="flex flex-col gap-2 rounded-lg bg-white px-3 py-2 ring-1 ring-slate-200">
                      <span className="flex items-center justify-between gap-2">
                        <span className="min-w-0 truncate font-bold text-ink">{row.name}</span>
                        {row.bidStatus && <span className="shrink-0 text-xs text-ink-soft">{bidWords(row.bidStatus)}</span>}
                      </span>
                      {canStart ? (
                        <Button
                          variant="secondary"
                          className="min-h-9 self-start px-3 py-1 text-sm"
                          busy={open.isPending && opening === row.shopId}
                          onClick={() => {
                            setOpening(row.shopId);
                            open.mutate({ shopId: row.shopId });
                          }}
                        >
                          Write to {row.name}
                        </Button>
                      ) : (
                        <span className="text-sm text-ink-soft">No conversation</span>
                      )}
                    </div>
                  )}
                </li>
              );
            })}
          </ul>
          <div className="min-w-0 rounded-lg lg:border-l lg:border-slate-200 lg:pl-5">
            {selected ? (
              <ConversationView key={selected.id} thread={selected} side="builder" jobStatus={jobStatus} focusComposer={chosenHere} />
            ) : (
              <p className="py-6 text-ink-soft">Choose a shop to read its messages or write to it.</p>
            )}
          </div>
        </div>
      )}
    </PanelFrame>
  );
}

function ShopPanel({ jobId, jobStatus }: { jobId: string; jobStatus: JobStatus }) {
  const threads = useJobThreads(jobId);
  const [asked, setAsked] = useState(false);
  const open = useOpenThread(jobId, { mutationConfig: { onSuccess: () => setAsked(true) } });
  const thread = threads.data?.[0];
  const headingId = useId();
  const [openId] = useOpenThreadParam();
  useBringIntoView(Boolean(thread) && thread?.id === openId);

  if (threads.isPending) {
    return (
      <PanelFrame title="Questions to the builder" lead="Loading …">
        <span className="sr-only">Loading the conversation</span>
      </PanelFrame>
    );
  }
  if (threads.isError && !threads.data) {
    return (
      <PanelFrame title="Questions to the builder" lead="Ask what the job does not say.">
        <Notice tone="error" title="The conversation could not be loaded" onRetry={() => void threads.refetch()}>
          {threads.error.message}
        </Notice>
      </PanelFrame>
    );
  }
  if (!thread) {
    if (jobStatus !== 'open') return null;
    return (
      <PanelFrame title="Questions to the builder" lead="Ask what the job does not say before you bid or revise. Only you and the builder see the conversation.">
        {open.error && <Notice tone="error">{open.error.message}</Notice>}
        <Button className="self-start" busy={open.isPending} onClick={() => open.mutate({})}>
          Ask the builder a question
        </Button>
      </PanelFrame>
    );
  }
  return (
    <PanelFrame
      id="conversations"
      headingId={headingId}
      title={`Conversation with ${thread.builder.displayName}`}
      lead="The builder who posted this job. Ask about the work, the parts and the timing; only the two of you see this conversation."
    >
      <ConversationView thread={thread} side="shop" jobStatus={jobStatus} focusComposer={asked} labelledBy={headingId} />
    </PanelFrame>
  );
}

/**
 * Conversations on a job page. The builder sees every shop that bid or asked,
 * with unread counts and the newest message, and opens one at a time; a shop
 * sees its own conversation with the builder ("Ask the builder a question"
 * starts it).
 */
export function ConversationPanel(props: ConversationPanelProps) {
  if (props.side === 'builder') return <BuilderPanel jobId={props.jobId} jobStatus={props.jobStatus} bidders={props.bidders} />;
  return <ShopPanel jobId={props.jobId} jobStatus={props.jobStatus} />;
}

import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BidInput, BidListAnswer, BidWithHistory, FeeRate, QueueJob, ShopBid, ShopBidListAnswer, WorkQueueAnswer } from '@shared/schemas/bids';
import { api } from '@client/lib/api-client';
import { type MutationConfig, useApiMutation } from '@client/lib/mutation';
import { bidKeys, jobChangeKeys } from '@client/lib/query-keys';

export type { BidWithHistory, ShopBid as MyBid, QueueJob };

export const bidQueries = {
  forJob: (jobId: string) => queryOptions({ queryKey: bidKeys.forJob(jobId), queryFn: () => api.get<BidListAnswer>(`/api/jobs/${jobId}/bids`).then((r) => r.bids) }),
  mine: () => queryOptions({ queryKey: bidKeys.mine(), queryFn: () => api.get<ShopBidListAnswer>('/api/bids/mine').then((r) => r.bids) }),
  /** The shop's won jobs not finished yet, soonest due first. */
  queue: () => queryOptions({ queryKey: bidKeys.queue(), queryFn: () => api.get<WorkQueueAnswer>('/api/shop/queue').then((r) => r.jobs) }),
  detail: (id: string) => queryOptions({ queryKey: bidKeys.detail(id), queryFn: () => api.get<BidWithHistory>(`/api/bids/${id}`) }),
  /** Tenthmark's fee rate now: what a bid accepted today pays. */
  feeRate: () => queryOptions({ queryKey: bidKeys.feeRate(), queryFn: () => api.get<FeeRate>('/api/bids/fee-rate').then((r) => r.feeBps), staleTime: 5 * 60_000 }),
};

export const useJobBids = (jobId: string) => useQuery(bidQueries.forJob(jobId));
export const useMyBids = () => useQuery(bidQueries.mine());
export const useWorkQueue = () => useQuery(bidQueries.queue());
export const useFeeRate = () => useQuery(bidQueries.feeRate());
export const useBid = (id: string | null | undefined) => useQuery({ ...bidQueries.detail(id ?? ''), enabled: Boolean(id) });

type Config<TVars> = MutationConfig<BidWithHistory, TVars>;

/** Every bid change changes its job (status, bid count): the bid goes into the cache, and everything that shows the job refreshes. */
const useBidMutation = <TVars>(run: (vars: TVars) => Promise<BidWithHistory>, config?: Config<TVars>) =>
  useApiMutation(
    run,
    { update: (queryClient, result) => queryClient.setQueryData(bidKeys.detail(result.bid.id), result), refreshes: (result) => jobChangeKeys(result.bid.jobId) },
    config,
  );

export const usePlaceBid = (jobId: string, options?: { mutationConfig?: Config<BidInput> }) =>
  useBidMutation((input: BidInput) => api.post<BidWithHistory>(`/api/jobs/${jobId}/bids`, input), options?.mutationConfig);
export const useReviseBid = (options?: { mutationConfig?: Config<{ id: string; input: BidInput }> }) =>
  useBidMutation(({ id, input }: { id: string; input: BidInput }) => api.put<BidWithHistory>(`/api/bids/${id}`, input), options?.mutationConfig);
export const useWithdrawBid = (options?: { mutationConfig?: Config<string> }) =>
  useBidMutation((id: string) => api.post<BidWithHistory>(`/api/bids/${id}/withdraw`), options?.mutationConfig);
export const useAcceptBid = (options?: { mutationConfig?: Config<string> }) =>
  useBidMutation((id: string) => api.post<BidWithHistory>(`/api/bids/${id}/accept`), options?.mutationConfig);
export const useDeclineBid = (options?: { mutationConfig?: Config<{ id: string; reason: string }> }) =>
  useBidMutation(({ id, reason }: { id: string; reason: string }) => api.post<BidWithHistory>(`/api/bids/${id}/decline`, { reason }), options?.mutationConfig);

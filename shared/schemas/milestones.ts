import { z } from 'zod';
import { milestoneKinds } from './inspection';
import { storedPhotoSchema, type StoredPhoto, type UploadedPhotos } from './photos';

/**
 * What the milestone routes answer. The shop's input (`milestoneInputSchema`,
 * the kinds, the photo limit) stays with the inspection schemas.
 */

/** A milestone photo, re-encoded as WebP; before it is attached, only its uploader can load it. */
export type MilestonePhoto = StoredPhoto;

/** The answer to a milestone photo upload: the stored photos, ready to go with a milestone's photoIds. */
export type UploadedMilestonePhotos = UploadedPhotos;

export const milestoneSchema = z.object({
  id: z.uuid(),
  kind: z.enum(milestoneKinds),
  operation: z.string().nullable(),
  note: z.string(),
  carrier: z.string().nullable(),
  trackingNumber: z.string().nullable(),
  author: z.object({ id: z.uuid(), displayName: z.string() }),
  /** In the order the shop attached them; empty when none. */
  photos: z.array(storedPhotoSchema),
  createdAt: z.iso.datetime(),
});
export type Milestone = z.infer<typeof milestoneSchema>;

/** The job's timeline, oldest first. */
export const milestoneListSchema = z.object({ milestones: z.array(milestoneSchema) });
export type MilestoneList = z.infer<typeof milestoneListSchema>;

export const milestoneAnswerSchema = z.object({ milestone: milestoneSchema });
export type MilestoneAnswer = z.infer<typeof milestoneAnswerSchema>;

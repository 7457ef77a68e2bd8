/**
 * The channels of the job after the plan: its status and history, the home's photos, the
 * crew's work order (core/work-order.ts) and the test-out recorded from it.
 */
import { z } from 'zod';
import { InputError } from '../../core/errors.ts';
import { jobStatusChangeSchema } from '../../core/job-status.ts';
import { buildWorkOrder, renderWorkOrderText, type WorkOrder } from '../../core/work-order.ts';
import { bytesOfBase64, MAX_PHOTO_BASE64_CHARS } from '../../db/home-file-bundle.ts';
import { evaluateStoredHome } from '../../db/evaluation-inputs.ts';
import {
  changeJobStatus,
  jobHistory,
  type JobHistory,
  type JobStatusRecord,
} from '../../db/repositories/jobs.ts';
import {
  addPhoto,
  getPhoto,
  listPhotos,
  PHOTO_KINDS,
  PHOTO_MEDIA_TYPES,
  removePhoto,
  type PhotoSummary,
} from '../../db/repositories/photos.ts';
import { recordTestOut, type TestOutOutcome } from './test-out-entry.ts';
import { byId, channel, done, DONE, id, recordOf } from './_define.ts';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'expected a date as YYYY-MM-DD');
const measureIdSchema = z.string().min(1).max(64);
const measureIds = z.array(measureIdSchema).max(200);

/** A photo as the channels give it: its fields, and its bytes as base64 where asked. */
const photoSummarySchema = recordOf<PhotoSummary>();

/** An error about the photo's bytes named as the request names them. */
function underBase64(error: unknown): unknown {
  if (!(error instanceof InputError)) return error;
  return new InputError(
    error.problems.map((problem) => ({
      path: problem.path === 'bytes' ? 'base64' : problem.path,
      message: problem.message,
    })),
  );
}

/** The `jobs.*`, `photos.*` and `workOrder.*` channels. */
export const jobChannels = {
  // Where the home's job stands and every recorded change, oldest first.
  'jobs.history': channel({
    request: z.strictObject({ homeId: id }),
    response: recordOf<JobHistory>(),
    handle: ({ store }, request) => store.read((read) => jobHistory(read, request.homeId)),
  }),
  // One status change by the rule of core/job-status.ts; refused changes name to/at/by/reason.
  'jobs.changeStatus': channel({
    request: z.strictObject({ homeId: id, ...jobStatusChangeSchema.shape }),
    response: z.strictObject({
      entry: recordOf<JobStatusRecord>(),
      history: recordOf<JobHistory>(),
    }),
    handle: ({ store }, { homeId, ...change }) =>
      store.write((write) => ({
        entry: changeJobStatus(write, homeId, change),
        history: jobHistory(write, homeId),
      })),
  }),
  'photos.list': channel({
    request: z.strictObject({ homeId: id }),
    response: z.array(photoSummarySchema),
    handle: ({ store }, request) => store.read((read) => listPhotos(read, request.homeId)),
  }),
  // A JPEG, PNG or WebP image (told by its first bytes), at most 15 MiB, as base64.
  'photos.add': channel({
    request: z.strictObject({
      homeId: id,
      measureId: measureIdSchema.optional(),
      kind: z.enum(PHOTO_KINDS),
      caption: z.string().max(500).optional(),
      mediaType: z.enum(PHOTO_MEDIA_TYPES).optional(),
      base64: z.string().min(1).max(MAX_PHOTO_BASE64_CHARS),
    }),
    response: z.strictObject({ id, sha256: z.string(), byteCount: z.int().positive() }),
    handle: ({ store }, { homeId, base64, ...fields }) => {
      const bytes = bytesOfBase64(base64, 'base64');
      return store.write((write) => {
        try {
          const photoId = addPhoto(write, homeId, fields, bytes);
          const stored = getPhoto(write, photoId);
          return { id: photoId, sha256: stored.sha256, byteCount: stored.byteCount };
        } catch (error) {
          throw underBase64(error);
        }
      });
    },
  }),
  'photos.get': channel({
    request: byId,
    response: z.strictObject({ photo: photoSummarySchema, base64: z.string() }),
    handle: ({ store }, request) =>
      store.read((read) => {
        const { bytes, ...photo } = getPhoto(read, request.id);
        return { photo, base64: bytes.toString('base64') };
      }),
  }),
  'photos.remove': channel({
    request: byId,
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => removePhoto(write, request.id));
      return DONE;
    },
  }),
  // The crew's work order of the approved measures (the plan's package when none are named).
  'workOrder.get': channel({
    request: z.strictObject({
      homeId: id,
      measureIds: measureIds.optional(),
      quantities: z.record(measureIdSchema, z.number()).optional(),
    }),
    response: z.strictObject({
      homeId: id,
      order: recordOf<WorkOrder>(),
      text: z.string(),
      photos: z.array(photoSummarySchema),
      job: recordOf<JobHistory>(),
    }),
    handle: ({ store }, { homeId, ...options }) =>
      store.read((read) => {
        const order = buildWorkOrder(evaluateStoredHome(read, homeId).evaluation, options);
        return {
          homeId,
          order,
          text: renderWorkOrderText(order),
          photos: listPhotos(read, homeId),
          job: jobHistory(read, homeId),
        };
      }),
  }),
  // A test-out reading: stored as a test-out, set against the target, the job tested out.
  'workOrder.recordTestOut': channel({
    request: z.strictObject({
      homeId: id,
      cfm50: z.number().positive().max(100_000),
      testedOn: isoDate,
      by: z.string().max(200),
      measureIds: measureIds.optional(),
      note: z.string().max(2000).optional(),
    }),
    response: recordOf<TestOutOutcome>(),
    handle: ({ store }, request) => store.write((write) => recordTestOut(write, request)),
  }),
} as const;

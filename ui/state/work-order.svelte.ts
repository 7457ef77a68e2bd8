/**
 * The open home's work order (workOrder.get): the crew document of the plan's recommended
 * package, the home's photos with their thumbnails, and the job's stage with the two moves
 * the work order offers, approving the package and starting the work (jobs.changeStatus).
 * The store decides every move by the rule of core/job-status.ts; its refusals are shown
 * beside the box they name.
 */
import { call } from '../bridge.ts';
import type { ChannelRequest, ChannelResponse } from '../../electron/channels.ts';
import { storedWork, type UnitSystem } from '../quantities.ts';
import type { LoadStatus } from './homes.svelte.ts';

export type WorkOrderReply = ChannelResponse<'workOrder.get'>;
export type WorkOrderDocument = WorkOrderReply['order'];
export type WorkOrderMeasure = WorkOrderDocument['measures'][number];
export type JobHistory = WorkOrderReply['job'];
export type PhotoSummary = WorkOrderReply['photos'][number];

/** The moves the work order offers; the others are made elsewhere. */
export type WorkOrderMove = 'approved' | 'inProgress';

/** Today as YYYY-MM-DD in the user's own time zone. */
export function todayIso(): string {
  const now = new Date();
  const month = String(now.getMonth() + 1).padStart(2, '0');
  const day = String(now.getDate()).padStart(2, '0');
  return `${now.getFullYear()}-${month}-${day}`;
}

/** The settings' user name, once the settings carry one (an optional field). */
export async function settingsUserName(): Promise<string> {
  const reply = await call('settings.get', {});
  if (!reply.ok) return '';
  const settings: object = reply.value;
  const name = 'userName' in settings ? settings.userName : undefined;
  return typeof name === 'string' ? name : '';
}

/** The move a job can make from the work order at its stage, or null (none, or made elsewhere). */
export function moveOf(job: JobHistory): WorkOrderMove | null {
  if (job.status === 'audited' || job.status === 'scoped') return 'approved';
  if (job.status === 'approved') return 'inProgress';
  return null;
}

export class WorkOrderState {
  readonly homeId: number;
  status = $state<LoadStatus>('loading');
  failure = $state<string | null>(null);
  /** Whether the plan recommends no measure, so there is no work to order. */
  noWork = $state(false);
  order = $state.raw<WorkOrderDocument | null>(null);
  job = $state.raw<JobHistory | null>(null);
  photos = $state.raw<PhotoSummary[]>([]);
  /** Each photo's image as a data: URL, by photo id, once read. */
  thumbnails = $state.raw<Record<number, string>>({});
  /** Photos whose image could not be read, with why. */
  thumbnailFailures = $state.raw<Record<number, string>>({});
  /** Counts typed for measures without one, by measure id, in the shown unit. */
  countText = $state<Record<string, string>>({});
  /** Refusals of those counts, by measure id (`form` for the rest). */
  countErrors = $state<Record<string, string>>({});
  /** The counts the work order was last built with, by measure id, in the type's (IP) unit. */
  quantities = $state.raw<Record<string, number>>({});
  /** Who makes the job's next move, and when (the boxes beside its button). */
  by = $state('');
  at = $state(todayIso());
  moving = $state(false);
  /** The store's refusal of the last move, by box: `by`, `at`, or `move` for the rest. */
  moveErrors = $state<Record<string, string>>({});
  /** The last move made, in words, for the status line. */
  moved = $state('');
  /** Nothing typed here is lost by leaving: the boxes are filled in again from the settings. */
  readonly hasUnsaved = false;

  constructor(homeId: number) {
    this.homeId = homeId;
    void settingsUserName().then((name) => {
      if (this.by === '') this.by = name;
    });
  }

  /** Reads the work order, the photos and the job again. */
  async load(): Promise<void> {
    if (this.order === null) this.status = 'loading';
    const reply = await call('workOrder.get', this.#request(this.quantities));
    if (!reply.ok) {
      this.order = null;
      // A plan that recommends no work is an answer, not a failure: there is nothing to order.
      const noWork = reply.error.problems?.some(
        (problem) => problem.path === 'measureIds' && /recommends none/.test(problem.message),
      );
      this.noWork = noWork === true;
      this.failure = reply.error.message;
      this.status = 'failed';
      return;
    }
    this.noWork = false;
    this.#take(reply.value);
  }

  #take(value: WorkOrderReply): void {
    this.order = value.order;
    this.job = value.job;
    this.failure = null;
    this.status = 'ready';
    this.showPhotos(value.photos);
  }

  /** The request of the work order: the home, and the counts given on site. */
  #request(quantities: Readonly<Record<string, number>>): ChannelRequest<'workOrder.get'> {
    return Object.keys(quantities).length === 0
      ? { homeId: this.homeId }
      : { homeId: this.homeId, quantities: { ...quantities } };
  }

  /**
   * Builds the work order again with the counts typed for measures the home file gives none,
   * in the shown unit (ft or m, ft² or m², a count); blank boxes are left out.
   *
   * @returns true when the store took every count
   */
  async applyCounts(units: UnitSystem): Promise<boolean> {
    const order = this.order;
    if (order === null) return false;
    const quantities: Record<string, number> = {};
    const errors: Record<string, string> = {};
    for (const measure of order.measures) {
      const text = (this.countText[measure.id] ?? '').trim().replace(/,/g, '');
      if (text === '') continue;
      const shown = /^\d+(?:\.\d+)?$/.test(text) ? Number(text) : Number.NaN;
      if (!(shown > 0)) errors[measure.id] = 'Enter a count above 0, in digits.';
      else quantities[measure.id] = storedWork(shown, measure.unit, units);
    }
    this.countErrors = errors;
    if (Object.keys(errors).length > 0) return false;
    const reply = await call('workOrder.get', this.#request(quantities));
    if (!reply.ok) {
      const placed: Record<string, string> = {};
      for (const problem of reply.error.problems ?? []) {
        const id = /^quantities\.(.+)$/.exec(problem.path)?.[1];
        if (id !== undefined) placed[id] = sentence(problem.message);
      }
      this.countErrors =
        Object.keys(placed).length > 0 ? placed : { form: sentence(reply.error.message) };
      return false;
    }
    this.quantities = quantities;
    this.#take(reply.value);
    return true;
  }

  /** Takes the home's photo list, reading the images not read yet. */
  showPhotos(photos: PhotoSummary[]): void {
    this.photos = photos;
    for (const photo of photos) {
      if (this.thumbnails[photo.id] === undefined) void this.#readImage(photo.id);
    }
  }

  /** Reads the photo list again (after one was added or removed). */
  async reloadPhotos(): Promise<string | null> {
    const reply = await call('photos.list', { homeId: this.homeId });
    if (!reply.ok) return reply.error.message;
    this.showPhotos(reply.value);
    return null;
  }

  async #readImage(photoId: number): Promise<void> {
    const reply = await call('photos.get', { id: photoId });
    if (reply.ok) {
      const { photo, base64 } = reply.value;
      this.thumbnails = {
        ...this.thumbnails,
        [photoId]: `data:${photo.mediaType};base64,${base64}`,
      };
    } else {
      this.thumbnailFailures = { ...this.thumbnailFailures, [photoId]: reply.error.message };
    }
  }

  /** Takes the job as a reply gave it (a test-out recorded moves it on). */
  async reloadJob(): Promise<void> {
    const reply = await call('jobs.history', { homeId: this.homeId });
    if (reply.ok) this.job = reply.value;
  }

  /** Forgets a refusal once the box it names is typed in again. */
  touched(box: 'by' | 'at'): void {
    const { [box]: _gone, ...rest } = this.moveErrors;
    this.moveErrors = rest;
  }

  /**
   * Moves the job on: approves the package, or starts the work.
   *
   * @returns true when the store made the move
   */
  async move(to: WorkOrderMove): Promise<boolean> {
    // The button stays enabled (a disabled button would drop the focus); a second press waits.
    if (this.moving) return false;
    this.moving = true;
    const reply = await call('jobs.changeStatus', {
      homeId: this.homeId,
      to,
      at: this.at,
      by: this.by,
    });
    this.moving = false;
    if (!reply.ok) {
      const placed: Record<string, string> = {};
      for (const problem of reply.error.problems ?? []) {
        const box = problem.path === 'by' || problem.path === 'at' ? problem.path : 'move';
        placed[box] = sentence(problem.message);
      }
      if (Object.keys(placed).length === 0) placed['move'] = sentence(reply.error.message);
      this.moveErrors = placed;
      return false;
    }
    this.moveErrors = {};
    this.job = reply.value.history;
    this.moved = to === 'approved' ? 'The package is approved.' : 'The work has started.';
    return true;
  }
}

/** A message as a sentence: a capital first and a full stop last. */
export function sentence(message: string): string {
  const trimmed = message.trim();
  const capital = `${trimmed.charAt(0).toUpperCase()}${trimmed.slice(1)}`;
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}

/**
 * `sealwork workorder HOME_ID [--json]`: the crew's work order of a stored home's recommended
 * package, asked of the same channel as the screens (`workOrder.get`): as text (the core's
 * renderWorkOrderText, then where the job stands and the home's photos), or as JSON with
 * `--json` (the channel's reply without the text). Reads the project only.
 */
import { JOB_STATUS_LABELS } from '../core/job-status.ts';
import type { ChannelResponse } from './channels.ts';
import {
  ask,
  EXIT_OK,
  expectPositionals,
  UsageError,
  withProject,
  type CliOutput,
  type Parsed,
} from './cli-commands.ts';

type WorkOrderReply = ChannelResponse<'workOrder.get'>;

/** The job's status and the photos, after the work order's own text. */
function jobAndPhotosText(reply: WorkOrderReply): string {
  const { job, photos } = reply;
  const lines = [`Job: ${JOB_STATUS_LABELS[job.status]}`];
  const last = job.entries.at(-1);
  if (last !== undefined) lines[0] += ` since ${last.at} (${last.by})`;
  if (photos.length > 0) {
    lines.push('', 'Photos');
    for (const photo of photos) {
      const about = photo.measureId === null ? 'the house' : `measure ${photo.measureId}`;
      const caption = photo.caption === null ? '' : `: ${photo.caption}`;
      lines.push(`  #${photo.id} ${photo.kind}, ${about}${caption}`);
    }
  }
  return lines.join('\n');
}

/** Runs `workorder`. */
export async function runWorkOrder(parsed: Parsed, output: CliOutput): Promise<number> {
  const [idText = ''] = expectPositionals(parsed, ['HOME_ID']);
  if (!/^\d{1,9}$/.test(idText) || Number(idText) < 1) {
    throw new UsageError(`HOME_ID must be a home's number (1 or more), got "${idText}"`);
  }
  const homeId = Number(idText);
  const reply = await withProject(parsed, (context) => ask(context, 'workOrder.get', { homeId }));
  if (parsed.json) {
    const { text: _text, ...json } = reply;
    output.out(JSON.stringify(json, null, 2));
    return EXIT_OK;
  }
  output.out(`${reply.text.trimEnd()}\n\n${jobAndPhotosText(reply)}`);
  return EXIT_OK;
}

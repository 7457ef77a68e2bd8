/**
 * `sealwork workorder HOME_ID [--json | --pdf FILE]`: the crew's work order of a stored home's recommended
 * package, asked of the same channel as the screens (`workOrder.get`): as text (the core's
 * renderWorkOrderText, then where the job stands and the home's photos), or as JSON with
 * `--json` (the channel's reply without the text), or that text as a PDF of Letter pages
 * with `--pdf FILE` (electron/text-pdf.ts). Reads the project only.
 */
import { writeFile } from 'node:fs/promises';
import { JOB_STATUS_LABELS } from '../core/job-status.ts';
import { textPdf } from './text-pdf.ts';
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
  if (parsed.json && parsed.pdf !== undefined) {
    throw new UsageError('--pdf and --json: choose one');
  }
  const reply = await withProject(parsed, (context) => ask(context, 'workOrder.get', { homeId }));
  if (parsed.json) {
    const { text: _text, ...json } = reply;
    output.out(JSON.stringify(json, null, 2));
    return EXIT_OK;
  }
  const text = `${reply.text.trimEnd()}\n\n${jobAndPhotosText(reply)}`;
  if (parsed.pdf !== undefined) {
    const path = parsed.pdf;
    await writeFile(path, textPdf(text, `Work order: ${reply.order.homeName}`)).catch(
      (error: NodeJS.ErrnoException) => {
        throw new UsageError(`--pdf: could not write ${path} (${error.code ?? error.message})`);
      },
    );
    output.out(`Wrote the work order of home ${homeId} to ${path}.`);
    return EXIT_OK;
  }
  output.out(text);
  return EXIT_OK;
}

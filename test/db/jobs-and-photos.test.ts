/**
 * Job status and photos in the project file. What is checked comes from outside the code
 * under test: the job rule as issue #9 states it (status changes recorded with dates, no
 * skipping backwards without a reason) and as core/job-status.ts words it (common practice of
 * weatherization programs), replayed here through core's `checkedHistory`; the mapping of the
 * old job states as issue #9's plan gives it (assessed → audited, scheduled → approved,
 * inProgress → inProgress, done → testedOut, closed → closed); SHA-256 by node:crypto
 * (FIPS 180-4) over the bytes the test made, compared with what comes back.
 */
import { createHash } from 'node:crypto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { checkedHistory } from '../../core/job-status.ts';
import { InputError } from '../../core/errors.ts';
import { backupTo, restoreFrom } from '../../db/backup.ts';
import {
  exportHomeFileWithAttachments,
  importHomeFileWithAttachments,
} from '../../db/home-file-bundle.ts';
import { importHomeFile } from '../../db/home-file.ts';
import { portfolioSummary } from '../../db/portfolio.ts';
import {
  createHome,
  deleteHome,
  getHome,
  listHomes,
  purgeHome,
  updateHome,
} from '../../db/repositories/homes.ts';
import { changeJobStatus, jobHistory } from '../../db/repositories/jobs.ts';
import {
  addPhoto,
  getPhoto,
  listPhotos,
  MAX_PHOTO_BYTES,
  removePhoto,
} from '../../db/repositories/photos.ts';
import { getSettings } from '../../db/repositories/settings.ts';
import { openStore } from '../../db/store.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { jpegStart, pngImage, webpStart } from '../_lib/photo-bytes.ts';
import { projectDigest } from '../electron/_lib/table-digest.ts';
import { openTempProject, type TempProject } from './_lib/store-home.ts';

let project: TempProject;
beforeEach(() => {
  project = openTempProject();
});
afterEach(() => project.dispose());

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

/** A stored home (the invented base house of test/_lib/base-home.ts, measures m1–m3). */
function storedHome(): number {
  return project.store.write((write) => importHomeFile(write, validBaseHome()));
}

/** The InputError a run throws, or a failure. */
function inputErrorOf(run: () => unknown): InputError {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return error;
    throw error;
  }
  return expect.fail('expected an InputError');
}

describe('job status changes through the project file', () => {
  it('records each change with its date and who, and keeps the home’s status with it', () => {
    const homeId = storedHome();
    const { store } = project;
    expect(store.read((read) => jobHistory(read, homeId))).toMatchObject({
      status: 'audited',
      entries: [],
    });
    const change = (to: string, at: string, reason?: string) =>
      store.write((write) =>
        changeJobStatus(write, homeId, { to, at, by: 'A. Auditor', ...(reason ? { reason } : {}) }),
      );
    change('scoped', '2025-03-03');
    change('approved', '2025-03-10');
    change('onHold', '2025-03-12', 'waiting on an electrician');
    change('approved', '2025-04-01');
    change('inProgress', '2025-04-02T08:30:00Z');
    const history = store.read((read) => jobHistory(read, homeId));
    expect(history.status).toBe('inProgress');
    expect(store.read((read) => getHome(read, homeId)).jobStatus).toBe('inProgress');
    expect(store.sqlite.prepare('SELECT job_stage FROM homes WHERE id = ?').get(homeId)).toEqual({
      job_stage: 'inProgress',
    });
    expect(history.entries.map((entry) => [entry.status, entry.at, entry.by])).toEqual([
      ['scoped', '2025-03-03', 'A. Auditor'],
      ['approved', '2025-03-10', 'A. Auditor'],
      ['onHold', '2025-03-12', 'A. Auditor'],
      ['approved', '2025-04-01', 'A. Auditor'],
      ['inProgress', '2025-04-02T08:30:00Z', 'A. Auditor'],
    ]);
    expect(history.entries[2]).toMatchObject({
      reason: 'waiting on an electrician',
      fromStage: 'approved',
    });
    // The stored history is one the rule itself accepts, entry by entry.
    const replayed = checkedHistory(
      history.entries.map(({ id: _id, homeId: _home, createdAt: _at, ...entry }) => entry),
    );
    expect(replayed).toHaveLength(5);
  });

  it('refuses going back without a reason, a skip over approval and an earlier date; writes nothing', () => {
    const homeId = storedHome();
    const { store } = project;
    store.write((write) =>
      changeJobStatus(write, homeId, { to: 'approved', at: '2025-05-01', by: 'A. Auditor' }),
    );
    const digest = projectDigest(store.sqlite);
    const refused = (to: string, at: string, field: string) => {
      const error = inputErrorOf(() =>
        store.write((write) => changeJobStatus(write, homeId, { to, at, by: 'A. Auditor' })),
      );
      expect(error.field).toBe(field);
      expect(projectDigest(store.sqlite)).toBe(digest);
    };
    refused('audited', '2025-05-02', 'reason'); // backwards, no reason
    refused('testedOut', '2025-05-02', 'to'); // no test-out without the work
    refused('inProgress', '2025-04-30', 'at'); // before the last change
    refused('finished', '2025-05-02', 'to'); // not a status
    const back = store.write((write) =>
      changeJobStatus(write, homeId, {
        to: 'scoped',
        at: '2025-05-02',
        by: 'A. Auditor',
        reason: 'the client asked for a smaller scope',
      }),
    );
    expect(back).toMatchObject({
      status: 'scoped',
      reason: 'the client asked for a smaller scope',
    });
    expect(store.read((read) => getHome(read, homeId)).jobStatus).toBe('scoped');
  });

  it('starts from the stage stored on the home when no change was recorded', () => {
    const { store } = project;
    const homeId = store.write((write) =>
      createHome(write, { name: 'Entered late', jobStatus: 'inProgress', data: {} }),
    );
    // Back to approved from the stored stage needs a reason, as from a recorded one.
    const error = inputErrorOf(() =>
      store.write((write) =>
        changeJobStatus(write, homeId, { to: 'approved', at: '2025-01-01', by: 'B' }),
      ),
    );
    expect(error.field).toBe('reason');
    store.write((write) =>
      changeJobStatus(write, homeId, { to: 'testedOut', at: '2025-01-01', by: 'B' }),
    );
    expect(store.read((read) => jobHistory(read, homeId)).status).toBe('testedOut');
    // A new home cannot start on hold (it needs a stage and a reason).
    expect(
      inputErrorOf(() =>
        store.write((write) => createHome(write, { name: 'x', jobStatus: 'onHold', data: {} })),
      ).field,
    ).toBe('jobStatus');
  });

  it('moves the status only by a change: a home update with another status is refused', () => {
    const homeId = storedHome();
    const { store } = project;
    const home = store.read((read) => getHome(read, homeId));
    const input = { name: 'Renamed', data: home.data };
    store.write((write) => updateHome(write, homeId, { ...input, jobStatus: 'audited' }));
    const error = inputErrorOf(() =>
      store.write((write) => updateHome(write, homeId, { ...input, jobStatus: 'closed' })),
    );
    expect(error.field).toBe('jobStatus');
    expect(store.read((read) => getHome(read, homeId))).toMatchObject({
      name: 'Renamed',
      jobStatus: 'audited',
    });
  });

  it('filters the Homes list and counts the portfolio by the stages', () => {
    const { store } = project;
    const first = storedHome();
    const second = storedHome();
    storedHome();
    store.write((write) => {
      changeJobStatus(write, first, { to: 'approved', at: '2025-02-01', by: 'C' });
      changeJobStatus(write, second, { to: 'approved', at: '2025-02-01', by: 'C' });
      changeJobStatus(write, second, { to: 'inProgress', at: '2025-02-03', by: 'C' });
    });
    const ids = (jobStatus: 'approved' | 'inProgress' | 'audited') =>
      store.read((read) => listHomes(read, { jobStatus })).map((home) => home.id);
    expect(ids('approved')).toEqual([first]);
    expect(ids('inProgress')).toEqual([second]);
    expect(ids('audited')).toHaveLength(1);
    const counts = store.read((read) => portfolioSummary(read)).byJobStatus;
    expect(Object.fromEntries(counts.map((row) => [row.status, row.homes]))).toEqual({
      approved: 1,
      audited: 1,
      inProgress: 1,
    });
  });

  it('goes with the home when it is purged (ON DELETE CASCADE)', () => {
    const homeId = storedHome();
    const { store } = project;
    store.write((write) => {
      changeJobStatus(write, homeId, { to: 'scoped', at: '2025-02-01', by: 'C' });
      addPhoto(write, homeId, { kind: 'other' }, pngImage(4, 4));
      deleteHome(write, homeId);
      purgeHome(write, homeId);
    });
    const count = (table: string) =>
      (store.sqlite.prepare(`SELECT count(*) AS n FROM ${table}`).get() as { n: number }).n;
    expect([count('job_status_history'), count('photos')]).toEqual([0, 0]);
  });
});

describe('a file made at version 5 moves onto the stages', () => {
  it('maps each old job state to its stage, for the list, the portfolio and saved selections', () => {
    const path = `${project.folder.path}/v5.db`;
    const old = openStore(path, { targetVersion: 5 });
    const insert = old.sqlite.prepare(
      `INSERT INTO homes (name, job_status, data, created_at, updated_at)
       VALUES (?, ?, '{}', '2024-01-01T00:00:00.000Z', '2024-01-01T00:00:00.000Z')`,
    );
    const OLD_TO_NEW = {
      assessed: 'audited',
      scheduled: 'approved',
      inProgress: 'inProgress',
      done: 'testedOut',
      closed: 'closed',
    } as const;
    for (const oldStatus of Object.keys(OLD_TO_NEW)) insert.run(`Home ${oldStatus}`, oldStatus);
    old.sqlite
      .prepare(`INSERT INTO settings (key, value, updated_at) VALUES ('portfolioSelections', ?, ?)`)
      .run(
        JSON.stringify([
          { name: 'Booked', filter: { jobStatus: 'scheduled' } },
          { name: 'Finished', filter: { jobStatus: 'done', town: 'Ashby' } },
        ]),
        '2024-01-01T00:00:00.000Z',
      );
    old.close();

    const store = openStore(path);
    try {
      const homes = store.read((read) => listHomes(read));
      expect(Object.fromEntries(homes.map((home) => [home.name, home.jobStatus]))).toEqual(
        Object.fromEntries(
          Object.entries(OLD_TO_NEW).map(([oldStatus, stage]) => [`Home ${oldStatus}`, stage]),
        ),
      );
      for (const stage of Object.values(OLD_TO_NEW)) {
        expect(store.read((read) => listHomes(read, { jobStatus: stage }))).toHaveLength(1);
      }
      const counts = store.read((read) => portfolioSummary(read)).byJobStatus;
      expect(counts.map((row) => row.status).sort()).toEqual(Object.values(OLD_TO_NEW).sort());
      expect(store.read((read) => getSettings(read)).portfolioSelections).toEqual([
        { name: 'Booked', filter: { jobStatus: 'approved' } },
        { name: 'Finished', filter: { jobStatus: 'testedOut', town: 'Ashby' } },
      ]);
      // The old column keeps its values (add-only).
      const kept = store.sqlite.prepare('SELECT job_status FROM homes ORDER BY id').all();
      expect(kept).toEqual(Object.keys(OLD_TO_NEW).map((job_status) => ({ job_status })));
    } finally {
      store.close();
    }
  });
});

describe('photos', () => {
  it('stores JPEG, PNG and WebP by their first bytes, and refuses anything else naming the field', () => {
    const homeId = storedHome();
    const { store } = project;
    const add = (bytes: Uint8Array, mediaType?: 'image/jpeg' | 'image/png' | 'image/webp') =>
      store.write((write) =>
        addPhoto(write, homeId, { kind: 'before', ...(mediaType ? { mediaType } : {}) }, bytes),
      );
    add(jpegStart());
    add(pngImage(8, 8), 'image/png');
    add(webpStart());
    expect(store.read((read) => listPhotos(read, homeId)).map((photo) => photo.mediaType)).toEqual([
      'image/jpeg',
      'image/png',
      'image/webp',
    ]);
    const digest = projectDigest(store.sqlite);
    expect(inputErrorOf(() => add(Buffer.from('GIF89a-not-taken'))).field).toBe('bytes');
    expect(inputErrorOf(() => add(pngImage(2, 2), 'image/jpeg')).field).toBe('mediaType');
    expect(inputErrorOf(() => add(Buffer.alloc(0))).field).toBe('bytes');
    const tooLarge = Buffer.concat([pngImage(1, 1), Buffer.alloc(MAX_PHOTO_BYTES)]);
    expect(inputErrorOf(() => add(tooLarge)).message).toMatch(/at most 15728640 bytes/);
    expect(
      inputErrorOf(() =>
        store.write((write) =>
          addPhoto(write, homeId, { kind: 'after', measureId: 'no-such' }, jpegStart()),
        ),
      ).field,
    ).toBe('measureId');
    expect(projectDigest(store.sqlite)).toBe(digest);
  });

  it('reports a photo whose bytes no longer match their SHA-256 as damaged', () => {
    const homeId = storedHome();
    const { store } = project;
    const photoId = store.write((write) =>
      addPhoto(write, homeId, { kind: 'other' }, pngImage(6, 6, 4)),
    );
    // The bytes changed behind the repository’s back (a damaged copy, a hand edit).
    store.sqlite
      .prepare('UPDATE photos SET bytes = ? WHERE id = ?')
      .run(pngImage(6, 6, 5), photoId);
    let caught: unknown;
    try {
      store.read((read) => getPhoto(read, photoId));
    } catch (error) {
      caught = error;
    }
    expect(caught).toMatchObject({ kind: 'corrupt', field: 'photoId' });
  });

  it('a photo of the largest size survives a backup and restore byte for byte', () => {
    const homeId = storedHome();
    const { store } = project;
    // Up to the limit exactly: a PNG padded to 15 MiB (the padding after IEND is only bytes).
    const png = pngImage(64, 48, 11);
    const largest = Buffer.concat([png, Buffer.alloc(MAX_PHOTO_BYTES - png.length, 0x5a)]);
    const small = pngImage(16, 9, 5);
    const ids = store.write((write) => [
      addPhoto(write, homeId, { kind: 'before', measureId: 'm2', caption: 'lights' }, largest),
      addPhoto(write, homeId, { kind: 'after', measureId: 'm2' }, small),
    ]);
    const backup = `${project.folder.path}/photos.bak`;
    backupTo(store, backup);
    store.write((write) => removePhoto(write, ids[0] ?? 0));
    store.close();
    restoreFrom(backup, project.path);
    const restored = openStore(project.path);
    try {
      const photos = restored.read((read) => listPhotos(read, homeId));
      expect(photos.map((photo) => [photo.kind, photo.measureId, photo.byteCount])).toEqual([
        ['before', 'm2', MAX_PHOTO_BYTES],
        ['after', 'm2', small.length],
      ]);
      const back = restored.read((read) => photos.map((photo) => getPhoto(read, photo.id)));
      expect(back.map((photo) => sha256(photo.bytes))).toEqual([sha256(largest), sha256(small)]);
      expect(back.map((photo) => photo.sha256)).toEqual([sha256(largest), sha256(small)]);
      expect(back[0]?.bytes.equals(largest)).toBe(true);
    } finally {
      restored.close();
    }
  });

  it('survives a home-file bundle round trip byte for byte, finding its measure again', () => {
    const homeId = storedHome();
    const { store } = project;
    const images = [jpegStart(), pngImage(30, 20, 9), webpStart()];
    store.write((write) => {
      addPhoto(
        write,
        homeId,
        { kind: 'before', measureId: 'm1', caption: 'top plates' },
        images[0] ?? Buffer.alloc(0),
      );
      addPhoto(write, homeId, { kind: 'after', measureId: 'm1' }, images[1] ?? Buffer.alloc(0));
      addPhoto(
        write,
        homeId,
        { kind: 'other', caption: 'front door' },
        images[2] ?? Buffer.alloc(0),
      );
    });
    const bundle = store.read((read) => exportHomeFileWithAttachments(read, homeId));
    // Through JSON text, as a file on disk carries it.
    const text = JSON.stringify(bundle);
    const other = openTempProject();
    try {
      const copyId = other.store.write((write) =>
        importHomeFileWithAttachments(write, JSON.parse(text)),
      );
      const photos = other.store.read((read) =>
        listPhotos(read, copyId).map((photo) => getPhoto(read, photo.id)),
      );
      expect(photos.map((photo) => sha256(photo.bytes))).toEqual(images.map(sha256));
      expect(photos.map((photo) => [photo.kind, photo.measureId, photo.caption])).toEqual([
        ['before', 'm1', 'top plates'],
        ['after', 'm1', null],
        ['other', null, 'front door'],
      ]);
      // Export → import → export gives the same bundle.
      const again = other.store.read((read) => exportHomeFileWithAttachments(read, copyId));
      expect(again).toEqual(bundle);
    } finally {
      other.dispose();
    }
  });

  it('refuses a bundle whose photo is not its SHA-256 or not base64, storing nothing', () => {
    const homeId = storedHome();
    const { store } = project;
    store.write((write) => addPhoto(write, homeId, { kind: 'before' }, pngImage(3, 3)));
    const bundle = store.read((read) => exportHomeFileWithAttachments(read, homeId));
    const digest = projectDigest(store.sqlite);
    const photo = bundle.photos[0];
    if (photo === undefined) throw new Error('expected a photo');
    const changed = (patch: object) => ({ ...bundle, photos: [{ ...photo, ...patch }] });
    const flipped = Buffer.from(photo.base64, 'base64');
    flipped[20] = (flipped[20] ?? 0) ^ 1;
    const cases: [object, string][] = [
      [changed({ base64: flipped.toString('base64') }), 'photos[0].sha256'],
      [changed({ base64: 'not base64!' }), 'photos[0].base64'],
      [changed({ measureId: 'm9' }), 'photos[0].measureId'],
      [changed({ mediaType: 'image/webp' }), 'photos[0].mediaType'],
      [{ ...bundle, format: 'sealwork-home/1' }, 'format'],
    ];
    for (const [input, field] of cases) {
      const error = inputErrorOf(() =>
        store.write((write) => importHomeFileWithAttachments(write, input)),
      );
      expect(error.field, field).toBe(field);
      expect(projectDigest(store.sqlite)).toBe(digest);
    }
  });
});

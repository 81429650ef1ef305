import { randomBytes } from 'node:crypto';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import sharp from 'sharp';
import type { InspectionDetail, PhotoSummary } from '../../shared/src';
import { findFreePort } from '../../scripts/lib/postgres-cluster';
import { localObjectStorageClient } from '../../scripts/lib/local-object-storage';
import { seed as seedDemoInventory } from '../../seeds/demo-inventory';
import { seed as seedDemoStructures } from '../../seeds/demo-structures';
import { testObjectStorageUrl } from '../support/object-storage-settings';
import { SignInClient, type ClientResponse } from '../support/sign-in-client';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startSignInTestBed, type SignInTestBed } from '../support/test-server';

/** Demo staff (scripts/lib/local-identity-provider/demo-users.ts). */
const STAFF = {
  inspectorNorth: 'bv-staff-1041',
  inspectorSouth: 'bv-staff-1057',
  raterCentral: 'bv-staff-2013',
} as const;
type Staff = keyof typeof STAFF;

/** Small enough that a noisy test picture passes it, large enough for the drawn ones. */
const PHOTO_LIMIT_BYTES = 256 * 1024;

/** A drawn test picture, never a photograph: a grey sky over a dark girder soffit with one light spall patch. */
function drawnPicture(widthPx: number, heightPx: number) {
  const scene = Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${widthPx}" height="${heightPx}">` +
      `<rect y="${heightPx * 0.55}" width="${widthPx}" height="${heightPx * 0.25}" fill="#4a4f55"/>` +
      `<ellipse cx="${widthPx * 0.6}" cy="${heightPx * 0.72}" rx="${widthPx * 0.08}" ry="${heightPx * 0.05}" fill="#a89f91"/></svg>`,
  );
  return sharp({ create: { width: widthPx, height: heightPx, channels: 3, background: '#cdd5dc' } }).composite([{ input: scene }]);
}

/** Random pixels do not compress: a valid PNG bigger than the limit. */
function noisePng(widthPx: number, heightPx: number): Promise<Buffer> {
  return sharp(randomBytes(widthPx * heightPx * 3), { raw: { width: widthPx, height: heightPx, channels: 3 } })
    .png()
    .toBuffer();
}

interface ApiError {
  readonly error: { code: string; message: string; details: { fields?: { field: string; message: string }[] } | null };
}

describe('photos API', () => {
  let testDb: TestDatabase;
  let bed: SignInTestBed;
  const clients = new Map<Staff, SignInClient>();
  const userIds = new Map<Staff, number>();

  beforeAll(async () => {
    testDb = await createTestDatabase();
    await seedDemoStructures(testDb.db);
    await seedDemoInventory(testDb.db);
    bed = await startSignInTestBed(testDb.url, { PHOTO_MAX_BYTES: String(PHOTO_LIMIT_BYTES) });
    for (const staff of Object.keys(STAFF) as Staff[]) {
      const client = new SignInClient(bed.server.url);
      await client.signInAs(STAFF[staff]);
      clients.set(staff, client);
      userIds.set(staff, (await testDb.db('users').where({ subject: STAFF[staff] }).first('id')).id);
    }
  }, 60_000);
  afterAll(async () => {
    await bed.stop();
    await testDb.drop();
  });

  /** An inspection row as the inspections code would store it, on the first structure of the district. */
  async function inspection(author: Staff, district: string, state: 'draft' | 'submitted' | 'returned' | 'accepted' = 'draft'): Promise<number> {
    const structure = await testDb.db('structures').where({ district }).orderBy('structure_number').first('id');
    const [row] = await testDb
      .db('inspections')
      .insert({ structure_id: structure.id, inspected_on: '2026-11-20', kind: 'routine', inspector_id: userIds.get(author), state })
      .returning('id');
    return row.id;
  }

  async function finding(inspectionId: number): Promise<number> {
    const girder = await testDb
      .db({ g: 'girders' })
      .join({ sp: 'spans' }, 'sp.id', 'g.span_id')
      .join({ i: 'inspections' }, 'i.structure_id', 'sp.structure_id')
      .where('i.id', inspectionId)
      .first('g.id');
    const [row] = await testDb
      .db('findings')
      .insert({ inspection_id: inspectionId, girder_id: girder.id, kind: 'spall', from_m: 4, to_m: 4.6, severity: 'moderate', spall: JSON.stringify({ depthMm: 30, widthMm: 180 }) })
      .returning('id');
    return row.id;
  }

  function upload(staff: Staff, inspectionId: number, file: Buffer, name: string, fields: Record<string, string> = {}, client = clients.get(staff)!) {
    const form = new FormData();
    for (const [key, value] of Object.entries(fields)) form.append(key, value);
    // The client's type claims a JPEG whatever the file is: the server must not believe it.
    form.append('photo', new Blob([new Uint8Array(file)], { type: 'image/jpeg' }), name);
    return client.request(`/api/inspections/${inspectionId}/photos`, { multipart: form });
  }

  const json = <T>(response: ClientResponse) => JSON.parse(response.text) as T;
  const fieldsOf = (response: ClientResponse) => (json<ApiError>(response).error.details?.fields ?? []).map((f) => f.field);

  async function storedKeys(inspectionId: number, bucket = bed.config.objectStorage.bucket): Promise<string[]> {
    const client = localObjectStorageClient(testObjectStorageUrl());
    try {
      const listing = await client.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: `inspections/${inspectionId}/` }));
      return (listing.Contents ?? []).map((object) => object.Key!).sort();
    } finally {
      client.destroy();
    }
  }

  const photoRows = (inspectionId: number) => testDb.db('photos').where({ inspection_id: inspectionId });
  const photoEvents = (action: string) => testDb.db('audit_events').where({ action, entity_type: 'photo' });

  describe('POST /api/inspections/:id/photos', () => {
    it.each([
      ['JPEG', 'image/jpeg', 'jpg', () => drawnPicture(1200, 800).jpeg().toBuffer(), [1200, 800]],
      ['PNG', 'image/png', 'png', () => drawnPicture(500, 700).png().toBuffer(), [500, 700]],
      ['WebP', 'image/webp', 'webp', () => drawnPicture(900, 900).webp().toBuffer(), [900, 900]],
    ] as const)('adds a %s with a JPEG thumbnail of at most 320 px, and serves the original byte for byte', async (_name, contentType, extension, make, [widthPx, heightPx]) => {
      const id = await inspection('inspectorNorth', 'North District');
      const file = await make();
      const response = await upload('inspectorNorth', id, file, `Girder 2 soffit.${extension}`);
      expect(response.status).toBe(201);
      const photo = json<PhotoSummary>(response);
      expect(photo).toEqual({
        id: expect.any(Number),
        inspectionId: id,
        findingId: null,
        contentType,
        byteSize: file.length,
        widthPx,
        heightPx,
        originalName: `Girder 2 soffit.${extension}`,
        uploaded: { at: expect.any(String), by: 'Dana Whitcombe' },
      });

      const original = await clients.get('raterCentral')!.request(`/api/photos/${photo.id}`);
      expect(original.status).toBe(200);
      expect(original.headers.get('content-type')).toBe(contentType);
      expect(original.headers.get('cache-control')).toMatch(/^private, max-age=\d+$/);
      expect(original.headers.get('x-content-type-options')).toBe('nosniff');
      expect(original.bytes.equals(file)).toBe(true);

      const thumbnail = await clients.get('raterCentral')!.request(`/api/photos/${photo.id}/thumbnail`);
      expect(thumbnail.status).toBe(200);
      expect(thumbnail.headers.get('content-type')).toBe('image/jpeg');
      const thumbnailSize = await sharp(thumbnail.bytes).metadata();
      expect(thumbnailSize.format).toBe('jpeg');
      expect(Math.max(thumbnailSize.width, thumbnailSize.height)).toBe(Math.min(320, Math.max(widthPx, heightPx)));

      const keys = await storedKeys(id);
      expect(keys).toHaveLength(2);
      expect(keys).toContain((await photoRows(id).first()).object_key);
      expect(keys.every((key) => new RegExp(`^inspections/${id}/[0-9a-f-]{36}(\\.${extension}|-thumbnail\\.jpg)$`).test(key))).toBe(true);
      expect(await photoEvents('photo.added').where({ entity_id: String(photo.id) })).toEqual([
        expect.objectContaining({ user_id: userIds.get('inspectorNorth'), after: expect.objectContaining({ inspectionId: id, contentType, byteSize: file.length }) }),
      ]);
    });

    it('lists an inspection’s photos in the order they were added, for everyone', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const first = json<PhotoSummary>(await upload('inspectorNorth', id, await drawnPicture(300, 200).jpeg().toBuffer(), 'first.jpg'));
      const second = json<PhotoSummary>(await upload('inspectorNorth', id, await drawnPicture(200, 300).png().toBuffer(), 'second.png'));
      const listed = await clients.get('raterCentral')!.request(`/api/inspections/${id}/photos`);
      expect(listed.status).toBe(200);
      expect(json<PhotoSummary[]>(listed)).toEqual([first, second]);
    });

    it('attaches a photo to a finding of the inspection and refuses a finding of another, naming findingId', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const own = await finding(id);
      const elsewhere = await finding(await inspection('inspectorNorth', 'North District'));
      const picture = await drawnPicture(400, 300).jpeg().toBuffer();

      const attached = await upload('inspectorNorth', id, picture, 'spall.jpg', { findingId: String(own) });
      expect(attached.status).toBe(201);
      expect(json<PhotoSummary>(attached).findingId).toBe(own);

      for (const findingId of [String(elsewhere), 'spall', '0']) {
        const refused = await upload('inspectorNorth', id, picture, 'spall.jpg', { findingId });
        expect(refused.status).toBe(400);
        expect(fieldsOf(refused)).toEqual(['findingId']);
      }
      const unknownField = await upload('inspectorNorth', id, picture, 'spall.jpg', { girderId: '3' });
      expect(unknownField.status).toBe(400);
      expect(fieldsOf(unknownField)).toEqual(['girderId']);
      expect(await photoRows(id)).toHaveLength(1);
    });

    it('shows the photos on the inspection and on its finding, and a deleted draft takes its photos and files with it', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const findingId = await finding(id);
      const onFinding = json<PhotoSummary>(await upload('inspectorNorth', id, await drawnPicture(320, 240).jpeg().toBuffer(), 'spall.jpg', { findingId: String(findingId) }));
      const onInspection = json<PhotoSummary>(await upload('inspectorNorth', id, await drawnPicture(320, 240).png().toBuffer(), 'deck.png'));
      const detail = json<InspectionDetail>(await clients.get('inspectorNorth')!.request(`/api/inspections/${id}`));
      expect(detail.photoIds).toEqual([onFinding.id, onInspection.id]);
      expect(detail.findings.find((f) => f.id === findingId)!.photoIds).toEqual([onFinding.id]);
      expect(await storedKeys(id)).toHaveLength(4);

      expect((await clients.get('inspectorNorth')!.request(`/api/inspections/${id}`, { method: 'DELETE' })).status).toBe(204);
      expect(await photoRows(id)).toEqual([]);
      expect(await storedKeys(id)).toEqual([]);
    });

    it('keeps a photo on its inspection when its finding is deleted', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const findingId = await finding(id);
      const photo = json<PhotoSummary>(await upload('inspectorNorth', id, await drawnPicture(300, 300).jpeg().toBuffer(), 'crack.jpg', { findingId: String(findingId) }));
      await testDb.db('findings').where({ id: findingId }).delete();
      expect((await photoRows(id).first()).finding_id).toBeNull();
      expect((await clients.get('inspectorNorth')!.request(`/api/photos/${photo.id}`)).status).toBe(200);
    });

    it('judges the type by the content: a text file named .jpg is refused with 415 naming photo', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const renamed = await upload('inspectorNorth', id, Buffer.from('Span 2, girder 4: exposed strands near the bearing\n'), 'notes.jpg');
      expect(renamed.status).toBe(415);
      expect(json<ApiError>(renamed).error.code).toBe('unsupported_media_type');
      expect(json<ApiError>(renamed).error.message).toMatch(/^photo: /);
      expect(fieldsOf(renamed)).toEqual(['photo']);

      const gif = await upload('inspectorNorth', id, await drawnPicture(60, 40).gif().toBuffer(), 'drawing.jpg');
      expect(gif.status).toBe(415);
      const jpeg = await drawnPicture(800, 600).jpeg().toBuffer();
      const cutShort = await upload('inspectorNorth', id, jpeg.subarray(0, Math.floor(jpeg.length / 2)), 'cut-short.jpg');
      expect(cutShort.status).toBe(415);
      expect(fieldsOf(cutShort)).toEqual(['photo']);

      expect(await photoRows(id)).toHaveLength(0);
      expect(await storedKeys(id)).toEqual([]);
    });

    it('refuses a photo past the size limit with 413', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const big = await noisePng(400, 400);
      expect(big.length).toBeGreaterThan(PHOTO_LIMIT_BYTES);
      const response = await upload('inspectorNorth', id, big, 'big.png');
      expect(response.status).toBe(413);
      expect(json<ApiError>(response).error.code).toBe('payload_too_large');
      expect(fieldsOf(response)).toEqual(['photo']);
      expect(await photoRows(id)).toHaveLength(0);
      expect(await storedKeys(id)).toEqual([]);
    });

    it('asks for the file when none came, naming photo, and names a file sent in another field', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const none = new FormData();
      none.append('findingId', '');
      const missing = await clients.get('inspectorNorth')!.request(`/api/inspections/${id}/photos`, { multipart: none });
      expect(missing.status).toBe(400);
      expect(fieldsOf(missing)).toEqual(['photo']);

      const elsewhere = new FormData();
      elsewhere.append('image', new Blob([new Uint8Array(await drawnPicture(50, 50).jpeg().toBuffer())]), 'a.jpg');
      const wrongField = await clients.get('inspectorNorth')!.request(`/api/inspections/${id}/photos`, { multipart: elsewhere });
      expect(wrongField.status).toBe(400);
      expect(fieldsOf(wrongField)).toEqual(['image']);

      const asJson = await clients.get('inspectorNorth')!.request(`/api/inspections/${id}/photos`, { json: { photo: 'a.jpg' } });
      expect(asJson.status).toBe(400);
      expect(fieldsOf(asJson)).toEqual(['photo']);
    });

    it('lets only the author add photos, within their districts, and raters not at all (403)', async () => {
      const north = await inspection('inspectorNorth', 'North District');
      const picture = await drawnPicture(300, 200).jpeg().toBuffer();
      const otherInspector = await upload('inspectorSouth', north, picture, 'a.jpg');
      expect(otherInspector.status).toBe(403);
      expect(json<ApiError>(otherInspector).error.message).toMatch(/Dana Whitcombe/);
      expect((await upload('raterCentral', north, picture, 'a.jpg')).status).toBe(403);
      // An author whose districts no longer cover the structure may not change it either.
      const outsideDistricts = await inspection('inspectorNorth', 'South District');
      expect((await upload('inspectorNorth', outsideDistricts, picture, 'a.jpg')).status).toBe(403);
      expect(await testDb.db('photos').whereIn('inspection_id', [north, outsideDistricts])).toHaveLength(0);
    });

    it('refuses a submitted or accepted inspection with 409 read_only, and takes photos for a returned one', async () => {
      const picture = await drawnPicture(300, 200).jpeg().toBuffer();
      for (const state of ['submitted', 'accepted'] as const) {
        const id = await inspection('inspectorNorth', 'North District', state);
        const response = await upload('inspectorNorth', id, picture, 'late.jpg');
        expect(response.status).toBe(409);
        expect(json<ApiError>(response).error.code).toBe('read_only');
        expect(await storedKeys(id)).toEqual([]);
      }
      const returned = await inspection('inspectorNorth', 'North District', 'returned');
      expect((await upload('inspectorNorth', returned, picture, 'more.jpg')).status).toBe(201);
    });

    it('answers 404 for an inspection that does not exist and 400 for an id that is not one', async () => {
      const picture = await drawnPicture(100, 100).jpeg().toBuffer();
      const missing = await upload('inspectorNorth', 999_999, picture, 'a.jpg');
      expect(missing.status).toBe(404);
      expect(json<ApiError>(missing).error.message).toMatch(/no inspection with id 999999/);
      expect((await clients.get('inspectorNorth')!.request('/api/inspections/999999/photos')).status).toBe(404);
      const badId = await clients.get('inspectorNorth')!.request('/api/inspections/first/photos');
      expect(badId.status).toBe(400);
      expect(fieldsOf(badId)).toEqual(['id']);
    });

    it('removes the stored files again when the database refuses the row', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      await testDb.db.raw(`create function photos_refuse_for_test() returns trigger language plpgsql as $$
        begin
          if new.original_name = 'refused-by-database.jpg' then raise exception 'refused for a test'; end if;
          return new;
        end $$`);
      await testDb.db.raw('create trigger photos_refuse_for_test before insert on photos for each row execute function photos_refuse_for_test()');
      try {
        const response = await upload('inspectorNorth', id, await drawnPicture(300, 200).jpeg().toBuffer(), 'refused-by-database.jpg');
        expect(response.status).toBe(500);
        expect(await photoRows(id)).toHaveLength(0);
        expect(await storedKeys(id)).toEqual([]);
      } finally {
        await testDb.db.raw('drop trigger photos_refuse_for_test on photos');
        await testDb.db.raw('drop function photos_refuse_for_test()');
      }
    });
  });

  describe('when the photo store fails', () => {
    async function stateOf(inspectionId: number) {
      return testDb.db('inspections').where({ id: inspectionId }).first('version', 'updated_at', 'state');
    }

    it.each([
      ['does not answer', async () => ({ S3_ENDPOINT: `http://127.0.0.1:${await findFreePort()}` })],
      ['has no such bucket', async () => ({ S3_BUCKET: 'no-such-bucket-for-photos' })],
    ])('answers 502 storage_unavailable and writes nothing when the store %s', async (_case, storageEnv) => {
      const failing = await startSignInTestBed(testDb.url, await storageEnv());
      try {
        const inspector = new SignInClient(failing.server.url);
        await inspector.signInAs(STAFF.inspectorNorth);
        const id = await inspection('inspectorNorth', 'North District');
        const before = await stateOf(id);
        const eventsBefore = (await photoEvents('photo.added')).length;

        const response = await upload('inspectorNorth', id, await drawnPicture(300, 200).jpeg().toBuffer(), 'a.jpg', {}, inspector);
        expect(response.status).toBe(502);
        expect(json<ApiError>(response).error).toMatchObject({ code: 'storage_unavailable', message: expect.stringMatching(/photo store .*nothing was saved/) });
        expect(await photoRows(id)).toHaveLength(0);
        expect(await photoEvents('photo.added')).toHaveLength(eventsBefore);
        expect(await stateOf(id)).toEqual(before);
      } finally {
        await failing.stop();
      }
    }, 30_000);

    it('answers 502 when a stored photo cannot be read, and 404 when the store has lost its file', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const photo = json<PhotoSummary>(await upload('inspectorNorth', id, await drawnPicture(300, 200).jpeg().toBuffer(), 'a.jpg'));
      const failing = await startSignInTestBed(testDb.url, { S3_ENDPOINT: `http://127.0.0.1:${await findFreePort()}` });
      try {
        const viewer = new SignInClient(failing.server.url);
        await viewer.signInAs(STAFF.raterCentral);
        const response = await viewer.request(`/api/photos/${photo.id}`);
        expect(response.status).toBe(502);
        expect(json<ApiError>(response).error.code).toBe('storage_unavailable');
      } finally {
        await failing.stop();
      }
      await testDb.db('photos').where({ id: photo.id }).update({ object_key: `inspections/${id}/lost.jpg` });
      const lost = await clients.get('raterCentral')!.request(`/api/photos/${photo.id}`);
      expect(lost.status).toBe(404);
    }, 30_000);
  });

  describe('DELETE /api/photos/:id', () => {
    it('lets the author remove a photo: the row, its files, with a history event', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const photo = json<PhotoSummary>(await upload('inspectorNorth', id, await drawnPicture(300, 200).jpeg().toBuffer(), 'blurred.jpg'));
      expect(await storedKeys(id)).toHaveLength(2);

      expect((await clients.get('inspectorSouth')!.request(`/api/photos/${photo.id}`, { method: 'DELETE' })).status).toBe(403);
      expect((await clients.get('raterCentral')!.request(`/api/photos/${photo.id}`, { method: 'DELETE' })).status).toBe(403);
      const removed = await clients.get('inspectorNorth')!.request(`/api/photos/${photo.id}`, { method: 'DELETE' });
      expect(removed.status).toBe(204);

      expect(await photoRows(id)).toHaveLength(0);
      expect(await storedKeys(id)).toEqual([]);
      expect(await photoEvents('photo.deleted').where({ entity_id: String(photo.id) })).toEqual([
        expect.objectContaining({ user_id: userIds.get('inspectorNorth'), before: expect.objectContaining({ originalName: 'blurred.jpg', inspectionId: id }) }),
      ]);
      const gone = await clients.get('inspectorNorth')!.request(`/api/photos/${photo.id}`);
      expect(gone.status).toBe(404);
      expect(json<ApiError>(gone).error.message).toBe(`There is no photo with id ${photo.id}`);
      expect((await clients.get('inspectorNorth')!.request(`/api/photos/${photo.id}/thumbnail`)).status).toBe(404);
      expect((await clients.get('inspectorNorth')!.request(`/api/photos/${photo.id}`, { method: 'DELETE' })).status).toBe(404);
    });

    it('keeps the photos of a submitted inspection (409 read_only)', async () => {
      const id = await inspection('inspectorNorth', 'North District');
      const photo = json<PhotoSummary>(await upload('inspectorNorth', id, await drawnPicture(300, 200).jpeg().toBuffer(), 'kept.jpg'));
      await testDb.db('inspections').where({ id }).update({ state: 'submitted', submitted_at: testDb.db.fn.now() });
      const response = await clients.get('inspectorNorth')!.request(`/api/photos/${photo.id}`, { method: 'DELETE' });
      expect(response.status).toBe(409);
      expect(json<ApiError>(response).error.code).toBe('read_only');
      expect(await photoRows(id)).toHaveLength(1);
      expect(await storedKeys(id)).toHaveLength(2);
    });
  });
});

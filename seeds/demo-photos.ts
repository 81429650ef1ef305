import type { Knex } from 'knex';
import sharp from 'sharp';
import type { ObjectStorage } from '../backend/src/photos/object-storage';
import { preparePhoto } from '../backend/src/photos/photo-image';
import { insertPhoto } from '../backend/src/photos/photos.repository';

/**
 * Drawn pictures for the demo inspections' findings — sketches of a girder's end with the damage
 * marked, made here from shapes; the demo holds no real photographs.
 */
function sketchOf(kind: string, variant: number): string {
  const damage: Record<string, string> = {
    spall: '<path d="M150 300 q40 -50 110 -30 q40 20 20 60 z" fill="#b55d3a" stroke="#5a2a17" stroke-width="4"/>',
    'lost-strands': '<g stroke="#8a1c1c" stroke-width="8"><line x1="170" y1="330" x2="200" y2="300"/><line x1="230" y1="330" x2="260" y2="300"/></g>',
    'strand-section-loss': '<g fill="none" stroke="#9c5a00" stroke-width="5"><circle cx="190" cy="318" r="12"/><circle cx="240" cy="318" r="12"/></g>',
    crack: '<path d="M90 120 l30 40 l-10 30 l25 45" fill="none" stroke="#333" stroke-width="4"/>',
  };
  const sky = ['#dfe9ee', '#e8e4d8', '#e3ece0'][variant % 3];
  return `<svg xmlns="http://www.w3.org/2000/svg" width="640" height="420" viewBox="0 0 640 420">
    <rect width="640" height="420" fill="${sky}"/>
    <rect x="0" y="360" width="640" height="60" fill="#8c8f7a"/>
    <path d="M60 60 h320 v40 h-120 v200 h60 v40 h-200 v-40 h60 v-200 h-120 z" fill="#c9c6bd" stroke="#6b6a63" stroke-width="4"/>
    <rect x="420" y="60" width="180" height="280" fill="#d6d3ca" stroke="#6b6a63" stroke-width="3"/>
    ${damage[kind] ?? damage['crack']}
  </svg>`;
}

/** Knex seed entry point with the photo store: one drawn picture for each demo finding that has none. */
export async function seedDemoPhotos(knex: Knex, storage: ObjectStorage): Promise<void> {
  const findings: { id: number; inspection_id: number; kind: string; inspector_id: number }[] = await knex('findings as f')
    .join('inspections as i', 'i.id', 'f.inspection_id')
    .whereNotExists(knex('photos').whereRaw('photos.finding_id = f.id'))
    .whereIn('f.kind', ['spall', 'lost-strands', 'strand-section-loss', 'crack'])
    .orderBy('f.id')
    .select('f.id', 'f.inspection_id', 'f.kind', 'i.inspector_id');
  for (const [index, finding] of findings.entries()) {
    const bytes = await sharp(Buffer.from(sketchOf(finding.kind, index))).jpeg({ quality: 80 }).toBuffer();
    const image = await preparePhoto(bytes, 'image/jpeg');
    const stem = `inspections/${finding.inspection_id}/demo-finding-${finding.id}`;
    await storage.putAll([
      { key: `${stem}.jpg`, body: bytes, contentType: 'image/jpeg' },
      { key: `${stem}-thumbnail.jpg`, body: image.thumbnail, contentType: 'image/jpeg' },
    ]);
    await insertPhoto(
      knex as Parameters<typeof insertPhoto>[0],
      {
        inspection_id: finding.inspection_id,
        finding_id: finding.id,
        object_key: `${stem}.jpg`,
        thumbnail_key: `${stem}-thumbnail.jpg`,
        content_type: 'image/jpeg',
        byte_size: bytes.length,
        width_px: image.widthPx,
        height_px: image.heightPx,
        original_name: `sketch-${finding.kind}.jpg`,
      },
      finding.inspector_id,
    );
  }
}

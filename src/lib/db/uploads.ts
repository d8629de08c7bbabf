import type { Knex } from 'knex';
import { isoOrNull } from '../records/paging.ts';

/** An upload's record (the bytes are in storage under storageKey). */
export interface Upload {
  id: number;
  horseId: number;
  kind: 'photo' | 'radiograph' | 'document';
  fileName: string;
  mimeType: string;
  sizeBytes: number;
  storageKey: string;
  thumbKey: string | null;
  uploadedBy: string | null;
  createdAt: string;
}

function fromRow(r: any): Upload {
  return {
    id: r.id, horseId: r.horse_id, kind: r.kind, fileName: r.file_name, mimeType: r.mime_type, sizeBytes: r.size_bytes,
    storageKey: r.storage_key, thumbKey: r.thumb_key, uploadedBy: r.uploaded_by_name ?? null, createdAt: isoOrNull(r.created_at)!,
  };
}

export async function listUploads(db: Knex, practiceId: number, horseId: number): Promise<Upload[]> {
  const rows = await db('uploads as u').leftJoin('users as us', 'us.id', 'u.uploaded_by').where({ 'u.practice_id': practiceId, 'u.horse_id': horseId }).orderBy('u.created_at', 'desc').select('u.*', 'us.name as uploaded_by_name');
  return rows.map(fromRow);
}

/** An upload of the practice, or null (another practice's upload is never returned). */
export async function getUpload(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<Upload | null> {
  const row = await db('uploads as u').leftJoin('users as us', 'us.id', 'u.uploaded_by').where({ 'u.practice_id': practiceId, 'u.id': id }).first('u.*', 'us.name as uploaded_by_name');
  return row ? fromRow(row) : null;
}

export async function insertUpload(
  db: Knex | Knex.Transaction,
  row: { practiceId: number; horseId: number; kind: string; fileName: string; mimeType: string; sizeBytes: number; storageKey: string; thumbKey: string | null; uploadedBy: number },
): Promise<number> {
  const [id] = await db('uploads').insert({
    practice_id: row.practiceId, horse_id: row.horseId, kind: row.kind, file_name: row.fileName, mime_type: row.mimeType,
    size_bytes: row.sizeBytes, storage_key: row.storageKey, thumb_key: row.thumbKey, uploaded_by: row.uploadedBy,
  });
  return Number(id);
}

export async function deleteUpload(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<void> {
  await db('uploads').where({ practice_id: practiceId, id }).delete();
}

import { mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';

/**
 * Where uploaded files live: UPLOADS_DIR (default .data/uploads, git-ignored), outside public/ so the
 * static server never hands them out; each practice has its own folder and files are named by a random
 * key, never by the uploader's file name.
 */
export function uploadsDir(): string {
  return path.resolve(process.env.UPLOADS_DIR ?? '.data/uploads');
}

function fileOf(practiceId: number, key: string): string {
  if (!/^[a-z0-9-]+\.[a-z]{3,4}$/.test(key)) throw new Error('Bad storage key');
  return path.join(uploadsDir(), String(practiceId), key);
}

export async function storeFile(practiceId: number, key: string, bytes: Uint8Array): Promise<void> {
  const file = fileOf(practiceId, key);
  await mkdir(path.dirname(file), { recursive: true });
  await writeFile(file, bytes, { flag: 'wx' });
}

export async function readStoredFile(practiceId: number, key: string): Promise<Buffer> {
  return readFile(fileOf(practiceId, key));
}

export async function removeStoredFile(practiceId: number, key: string): Promise<void> {
  await rm(fileOf(practiceId, key), { force: true });
}

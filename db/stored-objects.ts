import type { DB } from '@/db/index';
import { displayKey, withoutMetadataKey } from '@/db/attachments';

/**
 * Every object key a row refers to: an attachment's original, thumbnail, report-size image and copy without
 * metadata (whether or not the job has made them yet: their keys follow from the original's), and each issued
 * report's PDF (which outbox e-mails attach by the same key).
 */
export async function listReferencedObjectKeys(db: DB): Promise<Set<string>> {
  const keys = new Set<string>();
  for (const a of await db.selectFrom('attachments').select(['storage_key', 'thumbnail_key']).execute()) {
    keys.add(a.storage_key).add(displayKey(a.storage_key)).add(withoutMetadataKey(a.storage_key));
    if (a.thumbnail_key) keys.add(a.thumbnail_key);
  }
  for (const r of await db.selectFrom('reports').select('storage_key').execute()) keys.add(r.storage_key);
  for (const m of await db.selectFrom('mail_outbox').select('attachments').where('status', '!=', 'sent').execute()) {
    for (const a of m.attachments) keys.add(a.objectKey);
  }
  return keys;
}

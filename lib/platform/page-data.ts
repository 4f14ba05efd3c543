import 'server-only';
import { notFound } from 'next/navigation';
import { ForbiddenError, NotFoundError } from '@/lib/domain/errors';

/** Pages show the 404 page for a project that does not exist or belongs to another company. */
export async function loadProjectOr404<T>(load: () => Promise<T>): Promise<T> {
  try {
    return await load();
  } catch (err) {
    if (err instanceof NotFoundError || err instanceof ForbiddenError) notFound();
    throw err;
  }
}

import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db';
import { findJurisdictionBySlug } from '@/db/jurisdictions';
import { getVersionByNumber } from '@/db/rule-sets';
import { DiffView } from '@/components/admin/diff-view';
import { PageHeader } from '@/components/ui/page-header';
import { diffRuleSets } from '@/lib/admin/diff';
import { pageRoles } from '@/lib/auth/roles';
import { requirePageUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Compare rule set versions' };

export default async function DiffPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<{ from?: string; to?: string }> }) {
  const { slug } = await params;
  const query = await searchParams;
  await requirePageUser(pageRoles['/rules'], `/rules/${slug}/diff`);
  const db = getDb();
  const jurisdiction = await findJurisdictionBySlug(db, slug);
  if (!jurisdiction) notFound();
  const [from, to] = await Promise.all([
    getVersionByNumber(db, jurisdiction.id, Number(query.from)),
    getVersionByNumber(db, jurisdiction.id, Number(query.to)),
  ]);
  if (!from || !to) notFound();
  const label = (s: typeof from) => `v${s.version} (${s.status})`;
  return (
    <>
      <PageHeader kicker={jurisdiction.name} title={`Version ${from.version} → version ${to.version}`}>
        <Link href={`/rules/${slug}`} className="btn-secondary">All versions</Link>
      </PageHeader>
      <DiffView diff={diffRuleSets(from, to)} fromLabel={label(from)} toLabel={label(to)} />
    </>
  );
}

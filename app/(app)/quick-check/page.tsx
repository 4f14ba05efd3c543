import type { Metadata } from 'next';
import { QuickCheck } from '@/components/quick-check/quick-check';
import { PageHeader } from '@/components/ui/page-header';
import { SafetyNotice } from '@/components/ui/safety-notice';
import { getDb } from '@/db';
import { listJurisdictions } from '@/db/jurisdictions';
import { defaultParameters } from '@/lib/domain/params';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { publishedRuleSetOf } from '@/lib/services/evaluation';

export const metadata: Metadata = { title: 'Quick check' };

export default async function QuickCheckPage() {
  await requirePageUser(pageRoles['/quick-check'], '/quick-check');
  const db = getDb();
  const jurisdictions = await listJurisdictions(db);
  // The route builder's running totals use each jurisdiction's published parameters (model-code defaults before one).
  const options = await Promise.all(
    jurisdictions.map(async (j) => {
      const published = await publishedRuleSetOf(db, j.id);
      return { slug: j.slug, name: j.name, published: published !== null, parameters: published?.parameters ?? defaultParameters(j.editions) };
    }),
  );
  return (
    <>
      <PageHeader kicker="No project needed" title="Quick check" />
      <p className="mb-4 max-w-3xl text-sm text-ink-soft">
        Describe a closet and check it against a jurisdiction’s published rules without starting a project. Nothing is stored unless you
        save it as a project.
      </p>
      <div className="mb-5"><SafetyNotice compact /></div>
      <QuickCheck jurisdictions={options} />
    </>
  );
}

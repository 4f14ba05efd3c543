import type { Metadata } from 'next';
import { ApplianceLibrary } from '@/components/appliances/appliance-library';
import { PageHeader } from '@/components/ui/page-header';
import { getDb } from '@/db';
import { APPLIANCE_CSV_HEADER, applianceFields } from '@/lib/domain/appliances/model';
import { pageRoles } from '@/lib/domain/roles';
import { requirePageUser } from '@/lib/platform/auth/session';
import { listAppliances } from '@/lib/services/appliances';

export const metadata: Metadata = { title: 'Appliance library' };

export default async function AppliancesPage() {
  const user = await requirePageUser(pageRoles['/appliances'], '/appliances');
  const models = await listAppliances(getDb(), user);
  return (
    <>
      <PageHeader kicker="Your company’s models" title="Appliance library" />
      <p className="max-w-3xl text-sm text-ink-soft">
        Keep the washers and dryers your company installs, with the figures from each maker’s installation instructions. In the plan
        editor, choosing a model fills the unit’s fields; the plan keeps its own copy, so editing or deleting a model here never changes
        a saved plan. The maker’s instructions, the locally adopted code and the AHJ govern every figure.
      </p>
      <ApplianceLibrary initialModels={JSON.parse(JSON.stringify(models))} />
      <section className="card mt-6 p-5" aria-labelledby="csv-format">
        <h2 id="csv-format" className="text-lg font-bold">CSV format</h2>
        <p className="mt-1 text-sm text-ink-soft">
          Comma-separated, one model per row, the first line a header naming these columns (any order; kind, label, width, depth and height
          required). Empty cells are “not given”. Lengths are inches, or text with units such as <code>686 mm</code>; areas are square inches.
          A row whose kind and label match a model already here replaces its figures. If any row is wrong, nothing of the file is saved and
          each error names its line and column.
        </p>
        <pre className="mt-3 overflow-x-auto rounded bg-paper-deep p-3 text-xs" data-testid="csv-header" tabIndex={0} role="region" aria-label="CSV header line">{APPLIANCE_CSV_HEADER.join(',')}</pre>
        <dl className="mt-3 grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[max-content_1fr]">
          {applianceFields.map((f) => (
            <div key={f.column} className="contents">
              <dt className="font-mono">{f.column}</dt>
              <dd className="text-ink-soft">{f.help}{'required' in f && f.required ? ' Required.' : ''}</dd>
            </div>
          ))}
        </dl>
      </section>
    </>
  );
}

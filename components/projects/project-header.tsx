import Link from 'next/link';
import type { Project } from '@/db/projects';

const tabs = [
  { href: '', label: 'Overview' },
  { href: '/plan', label: 'Plan' },
  { href: '/drawing', label: 'Drawing' },
];

export function ProjectHeader({ project, current }: { project: Project; current: '' | '/plan' | '/drawing' | '/checks' }) {
  return (
    <div className="mb-6">
      <p className="kicker"><Link href="/projects" className="hover:underline">Projects</Link></p>
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold sm:text-3xl">
            {project.name}
            {project.isDemo && <span className="ml-2 align-middle rounded bg-brass-soft px-2 py-0.5 text-xs font-semibold">demo</span>}
            {project.archivedAt && <span className="ml-2 align-middle rounded bg-paper-deep px-2 py-0.5 text-xs font-semibold">archived</span>}
          </h1>
          <p className="mt-1 text-sm text-ink-soft">
            {project.siteAddress} · {project.jurisdiction.name}
            {project.permitNumber ? ` · permit ${project.permitNumber}` : ''}
          </p>
        </div>
      </div>
      <nav aria-label="Project" className="no-print mt-4 flex gap-1 border-b border-rule">
        {tabs.map((t) => (
          <Link
            key={t.href}
            href={`/projects/${project.id}${t.href}`}
            aria-current={current === t.href ? 'page' : undefined}
            className={`-mb-px border-b-2 px-3 py-2 text-sm font-semibold ${current === t.href ? 'border-brass text-ink' : 'border-transparent text-ink-soft hover:text-ink'}`}
          >
            {t.label}
          </Link>
        ))}
      </nav>
    </div>
  );
}

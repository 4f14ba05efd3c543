'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { ApiError, fetchJson } from '@/lib/platform/client/fetch-json';
import { projectInputSchema, type ProjectInput } from '@/lib/domain/projects/schema';
import { BusyButton } from '@/components/busy-button';

type Jurisdiction = { slug: string; name: string; editions: { building: string; electrical: string; plumbing: string } };

export function ProjectForm({
  jurisdictions,
  project,
  defaultJurisdiction = '',
}: {
  jurisdictions: Jurisdiction[];
  /** The company's default jurisdiction slug, preselected for a new project. */
  defaultJurisdiction?: string;
  project?: { id: string } & ProjectInput & { archived: boolean };
}) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  // After a successful save the page is still changing; the button stays busy so a second press cannot
  // create the project twice. The ref also catches a press landing before React re-renders.
  const [leaving, setLeaving] = useState(false);
  const inFlight = useRef(false);
  const leavingRef = useRef(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<ProjectInput>({
    resolver: zodResolver(projectInputSchema),
    defaultValues: project
      ? { name: project.name, siteAddress: project.siteAddress, jurisdiction: project.jurisdiction, permitNumber: project.permitNumber ?? '', notes: project.notes ?? '' }
      : { name: '', siteAddress: '', jurisdiction: defaultJurisdiction, permitNumber: '', notes: '' },
  });

  async function onSubmit(values: ProjectInput) {
    setFormError(null);
    try {
      const saved = await fetchJson<{ id: string }>(project ? `/api/projects/${project.id}` : '/api/projects', {
        method: project ? 'PATCH' : 'POST',
        json: values,
      });
      leavingRef.current = true;
      setLeaving(true);
      router.push(`/projects/${saved.id}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.errors.length) {
        for (const e of err.errors) setError(e.path as keyof ProjectInput, { message: e.message });
      } else setFormError((err as Error).message);
    }
  }
  const busy = isSubmitting || leaving;

  async function toggleArchive() {
    if (!project) return;
    try {
      await fetchJson(`/api/projects/${project.id}`, { method: 'PATCH', json: { archived: !project.archived } });
      router.push(project.archived ? `/projects/${project.id}` : '/projects');
      router.refresh();
    } catch (err) {
      setFormError((err as Error).message);
    }
  }

  const field = (name: keyof ProjectInput, label: string, input: React.ReactNode, hint?: string) => (
    <div>
      <label htmlFor={`project-${name}`} className="field-label">{label}</label>
      {hint && <p id={`project-${name}-hint`} className="text-xs text-ink-faint">{hint}</p>}
      {input}
      {errors[name] && <p id={`project-${name}-error`} className="field-error" role="alert">{errors[name]?.message}</p>}
    </div>
  );
  const aria = (name: keyof ProjectInput) => ({
    id: `project-${name}`,
    'aria-invalid': errors[name] ? true : undefined,
    'aria-describedby': errors[name] ? `project-${name}-error` : undefined,
  });

  return (
    <form
      onSubmit={(event) => {
        if (inFlight.current) {
          event.preventDefault();
          return;
        }
        inFlight.current = true;
        // Released when the save fails or the form is invalid; kept while the new page opens.
        void handleSubmit(onSubmit)(event).finally(() => {
          if (!leavingRef.current) inFlight.current = false;
        });
      }}
      className="card max-w-2xl space-y-5 p-6" noValidate>
      {field('name', 'Project name', <input {...register('name')} {...aria('name')} className="field-input" />)}
      {field('siteAddress', 'Site address', <input {...register('siteAddress')} {...aria('siteAddress')} className="field-input" autoComplete="street-address" />)}
      {field(
        'jurisdiction',
        'Jurisdiction (AHJ)',
        <select {...register('jurisdiction')} {...aria('jurisdiction')} className="field-input">
          <option value="">Choose…</option>
          {jurisdictions.map((j) => (
            <option key={j.slug} value={j.slug}>
              {j.name} — {j.editions.building}, {j.editions.electrical}, {j.editions.plumbing}
            </option>
          ))}
        </select>,
        'The checks use the code editions and amendments this jurisdiction adopted.',
      )}
      {field('permitNumber', 'Permit number (optional)', <input {...register('permitNumber')} {...aria('permitNumber')} className="field-input" />)}
      {field('notes', 'Notes (optional)', <textarea {...register('notes')} {...aria('notes')} rows={3} className="field-input" />)}
      {formError && <p role="alert" className="rounded-md bg-status-fail/10 px-3 py-2 text-sm text-status-fail">{formError}</p>}
      <div className="flex flex-wrap gap-3">
        <BusyButton type="submit" className="btn-primary" busy={busy} busyText={project ? 'Saving…' : 'Creating…'} data-testid="project-submit">
          {project ? 'Save project' : 'Create project'}
        </BusyButton>
        {project && (
          <button type="button" className="btn-secondary" onClick={toggleArchive}>
            {project.archived ? 'Restore project' : 'Archive project'}
          </button>
        )}
      </div>
    </form>
  );
}

/** The list as shown (search, order, archived), every page, as a CSV file. */
export function ProjectsCsvLink({ q, sort, dir, archived }: { q: string; sort: string; dir: 'asc' | 'desc'; archived: '0' | '1' | 'all' }) {
  const params = new URLSearchParams({ q, sort, dir, archived });
  return (
    <a href={`/api/projects.csv?${params}`} download className="btn-secondary mb-1">
      Download CSV
    </a>
  );
}

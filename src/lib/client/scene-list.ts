/** Filtering and sorting of the dashboard's scene list (pure). */
export interface SceneListRow {
  id: string;
  teamId: string;
  title: string;
  description?: string;
  time?: string;
  version: number;
  updatedAt: string;
  createdAt?: string;
  siteName?: string;
  createdBy?: string | null;
}

export type SortKey = 'updated-desc' | 'updated-asc' | 'title-asc' | 'title-desc' | 'time-asc';

export function filterScenes(rows: SceneListRow[], f: { search: string; site: string; author: string; sort: SortKey }): SceneListRow[] {
  const q = f.search.trim().toLocaleLowerCase();
  const out = rows.filter(
    (r) =>
      (!q || r.title.toLocaleLowerCase().includes(q) || (r.description ?? '').toLocaleLowerCase().includes(q)) &&
      (!f.site || r.siteName === f.site) &&
      (!f.author || r.createdBy === f.author),
  );
  const by: Record<SortKey, (a: SceneListRow, b: SceneListRow) => number> = {
    'updated-desc': (a, b) => b.updatedAt.localeCompare(a.updatedAt),
    'updated-asc': (a, b) => a.updatedAt.localeCompare(b.updatedAt),
    'title-asc': (a, b) => a.title.localeCompare(b.title),
    'title-desc': (a, b) => b.title.localeCompare(a.title),
    'time-asc': (a, b) => (a.time ?? '').localeCompare(b.time ?? ''),
  };
  return [...out].sort(by[f.sort]);
}

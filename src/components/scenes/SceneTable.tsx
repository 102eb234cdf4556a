/**
 * The dashboard's scene list: search, sort, filter by site and author, pages of 10, thumbnails; and the
 * team's recent activity.
 */
import { useActivity, useMembers, useScenes } from '../../lib/client/queries';
import { useId, useMemo, useState } from 'react';
import { QueryRoot } from '../ui/QueryRoot';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { errorText } from '../../lib/client/api';
import { timeAgo } from '../../lib/client/scene-view';
import { filterScenes, type SortKey } from '../../lib/client/scene-list';
import { INPUT, Labelled } from './controls';

const PAGE = 10;

/** The scene's thumbnail: the snapshot an editor saved, else the sky chart the server makes (src/lib/server/thumbnails/). */
function Thumb({ id, title, version }: { id: string; title: string; version?: number }) {
  const [failed, setFailed] = useState(false);
  if (failed)
    return (
      <span aria-hidden="true" className="flex h-16 w-16 items-center justify-center rounded border border-ink-700 bg-ink-850 text-brass-400">
        <svg width="22" height="22" viewBox="0 0 32 32" fill="none" stroke="currentColor">
          <circle cx="16" cy="16" r="12" strokeWidth="2" />
          <ellipse cx="16" cy="16" rx="12" ry="4.5" strokeWidth="1.5" transform="rotate(-28 16 16)" />
        </svg>
      </span>
    );
  return (
    <img
      src={`/api/scenes/${encodeURIComponent(id)}/thumbnail.png${version ? `?v=${version}` : ''}`}
      alt={`Sky of ${title}`}
      width={64}
      height={64}
      loading="lazy"
      className="h-16 w-16 rounded border border-ink-700 object-cover"
      onError={() => setFailed(true)}
    />
  );
}


const ACTION_TEXT: Record<string, string> = {
  'scene.create': 'created scene',
  'scene.update': 'edited scene',
  'scene.delete': 'deleted scene',
  'scene.restore': 'restored a version of scene',
  'scene.thumbnail': 'updated the thumbnail of scene',
  'link.create': 'shared a link to scene',
  'link.revoke': 'revoked a link to scene',
  'comment.create': 'commented on scene',
  'comment.resolve': 'resolved a comment on scene',
  'comment.reopen': 'reopened a comment on scene',
};

function ActivityList({ teamId, titles }: { teamId: string; titles: Map<string, string> }) {
  const q = useActivity(teamId);
  if (q.isPending) return <p className="text-sm text-ink-300">Loading activity…</p>;
  if (q.isError) return <Alert tone="error">Activity could not be loaded: {errorText(q.error)}</Alert>;
  if (!q.data.activity.length) return <p className="text-sm text-ink-300">Nothing has happened yet.</p>;
  return (
    <ol className="flex flex-col gap-1 text-sm" aria-label="Recent activity">
      {q.data.activity.map((a) => {
        const sceneId = a.subjectType === 'scene' ? a.subjectId : (a.detail.sceneId as string | undefined);
        const title = (sceneId && titles.get(sceneId)) || (a.detail.title as string | undefined);
        return (
          <li key={String(a.id)} className="flex flex-wrap gap-x-1">
            <span className="font-medium">{a.user?.name ?? 'Someone'}</span>
            <span className="text-ink-300">{ACTION_TEXT[a.action] ?? a.action.replace(/[._]/g, ' ')}</span>
            {sceneId && title ? (
              <a className="text-brass-300 underline" href={`/scenes/${encodeURIComponent(sceneId)}`}>
                {title}
              </a>
            ) : title ? (
              <span>{title}</span>
            ) : null}
            <time className="text-xs text-ink-300" dateTime={a.at} title={new Date(a.at).toLocaleString()}>
              · {timeAgo(a.at)}
            </time>
          </li>
        );
      })}
    </ol>
  );
}

function Table({ teamId, canCreate }: { teamId: string; canCreate: boolean }) {
  const id = useId();
  const q = useScenes(teamId);
  const members = useMembers(teamId);
  const names = useMemo(() => new Map((members.data?.members ?? []).map((m) => [m.userId, m.name])), [members.data]);
  const [search, setSearch] = useState('');
  const [site, setSite] = useState('');
  const [author, setAuthor] = useState('');
  const [sort, setSort] = useState<SortKey>('updated-desc');
  const [page, setPage] = useState(0);
  const rows = q.data?.scenes ?? [];
  const sites = useMemo(() => [...new Set(rows.map((r) => r.siteName).filter((s): s is string => !!s))].sort(), [rows]);
  const authors = useMemo(() => [...new Set(rows.map((r) => r.createdBy).filter((s): s is string => !!s))], [rows]);
  const filtered = useMemo(() => filterScenes(rows, { search, site, author, sort }), [rows, search, site, author, sort]);
  const pages = Math.max(1, Math.ceil(filtered.length / PAGE));
  const cur = Math.min(page, pages - 1);
  const shown = filtered.slice(cur * PAGE, cur * PAGE + PAGE);
  const titles = useMemo(() => new Map(rows.map((r) => [r.id, r.title])), [rows]);

  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-col gap-3">
        <div className="flex flex-wrap items-end gap-3">
          <Labelled id={`${id}-q`} label="Search" className="min-w-48 flex-1">
            <input id={`${id}-q`} type="search" className={INPUT} value={search} placeholder="Title or description" onChange={(e) => { setSearch(e.target.value); setPage(0); }} />
          </Labelled>
          {sites.length > 0 && (
            <Labelled id={`${id}-site`} label="Site">
              <select id={`${id}-site`} className={INPUT} value={site} onChange={(e) => { setSite(e.target.value); setPage(0); }}>
                <option value="">All sites</option>
                {sites.map((s) => (
                  <option key={s}>{s}</option>
                ))}
              </select>
            </Labelled>
          )}
          {authors.length > 0 && (
            <Labelled id={`${id}-author`} label="Author">
              <select id={`${id}-author`} className={INPUT} value={author} onChange={(e) => { setAuthor(e.target.value); setPage(0); }}>
                <option value="">Everyone</option>
                {authors.map((a) => (
                  <option key={a} value={a}>
                    {names.get(a) ?? 'A former member'}
                  </option>
                ))}
              </select>
            </Labelled>
          )}
          <Labelled id={`${id}-sort`} label="Sort">
            <select id={`${id}-sort`} className={INPUT} value={sort} onChange={(e) => setSort(e.target.value as SortKey)}>
              <option value="updated-desc">Last changed first</option>
              <option value="updated-asc">Oldest change first</option>
              <option value="title-asc">Title A–Z</option>
              <option value="title-desc">Title Z–A</option>
              <option value="time-asc">Sky time, earliest first</option>
            </select>
          </Labelled>
          {canCreate && (
            <a href={`/scenes/new?team=${encodeURIComponent(teamId)}`} className="rounded-md bg-brass-400 px-4 py-2 text-sm font-medium text-ink-950 hover:bg-brass-300">
              New scene
            </a>
          )}
        </div>
        {q.isPending && <p className="text-ink-300">Loading scenes…</p>}
        {q.isError && <Alert tone="error">Scenes could not be loaded: {errorText(q.error)}</Alert>}
        {q.data && rows.length === 0 && (
          <div className="rounded-md border border-dashed border-ink-700 p-6 text-center">
            <p className="font-medium">No scenes yet.</p>
            <p className="mt-1 text-sm text-ink-300">A scene keeps a site, a time, the sky layers, targets and pins together; editors can create one.</p>
          </div>
        )}
        {q.data && rows.length > 0 && (
          <>
            <p className="text-xs text-ink-300" aria-live="polite">
              {filtered.length} of {rows.length} scenes
            </p>
            <div className="overflow-x-auto">
              <table className="w-full text-left text-sm">
                <caption className="sr-only">Scenes of this team</caption>
                <thead className="text-ink-300">
                  <tr>
                    <th scope="col" className="py-2 pr-3 font-medium"><span className="sr-only">Preview</span></th>
                    <th scope="col" className="py-2 pr-3 font-medium">Title</th>
                    <th scope="col" className="hidden py-2 pr-3 font-medium md:table-cell">Site</th>
                    <th scope="col" className="hidden py-2 pr-3 font-medium md:table-cell">Author</th>
                    <th scope="col" className="py-2 pr-3 font-medium">Changed</th>
                    <th scope="col" className="py-2 font-medium">Version</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-ink-700">
                  {shown.map((s) => (
                    <tr key={s.id}>
                      <td className="py-2 pr-3">
                        <Thumb id={s.id} title={s.title} version={s.version} />
                      </td>
                      <td className="py-2 pr-3">
                        <a className="text-brass-300 underline hover:text-brass-200" href={`/scenes/${encodeURIComponent(s.id)}`}>
                          {s.title}
                        </a>
                      </td>
                      <td className="hidden py-2 pr-3 text-ink-300 md:table-cell">{s.siteName ?? '—'}</td>
                      <td className="hidden py-2 pr-3 text-ink-300 md:table-cell">{s.createdBy ? (names.get(s.createdBy) ?? '—') : '—'}</td>
                      <td className="py-2 pr-3 text-ink-300">
                        <time dateTime={s.updatedAt} title={new Date(s.updatedAt).toLocaleString()}>
                          {timeAgo(s.updatedAt)}
                        </time>
                      </td>
                      <td className="py-2 tabular-nums">{s.version}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            {pages > 1 && (
              <nav aria-label="Scene pages" className="flex items-center gap-2 text-sm">
                <Button variant="secondary" disabled={cur === 0} onClick={() => setPage(cur - 1)}>
                  Previous
                </Button>
                <span>
                  Page {cur + 1} of {pages}
                </span>
                <Button variant="secondary" disabled={cur >= pages - 1} onClick={() => setPage(cur + 1)}>
                  Next
                </Button>
              </nav>
            )}
          </>
        )}
      </div>
      <section aria-labelledby={`${id}-act`}>
        <h3 id={`${id}-act`} className="mb-2 text-sm font-semibold uppercase tracking-[0.15em] text-ink-300">
          Recent activity
        </h3>
        <ActivityList teamId={teamId} titles={titles} />
      </section>
    </div>
  );
}

export default function SceneTable(props: { teamId: string; canCreate?: boolean }) {
  return (
    <QueryRoot>
      <Table teamId={props.teamId} canCreate={props.canCreate ?? true} />
    </QueryRoot>
  );
}

export const paths = {
  signIn: '/signin',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  invitation: (token: string) => `/invitations/${token}`,
  projects: '/projects',
  project: (id: number | string) => `/projects/${id}`,
  /** A test campaign of a project: its results table and Trends. */
  campaign: (projectId: number | string, campaignId: number | string) => `/projects/${projectId}/campaigns/${campaignId}`,
  bench: '/bench',
  /** A saved view; `mark` selects one of its marks. */
  view: (id: number | string, mark?: number) => (mark === undefined ? `/views/${id}` : `/views/${id}?mark=${mark}`),
  shared: (token: string) => `/shared/${token}`,
  settings: '/settings',
  adminUsers: '/admin/users',
  outbox: '/outbox',
} as const;

/**
 * The Bench opening one recording: a demo recording is fetched from the server's demo files (`demo`), any
 * other comes from this browser's library by its fingerprint (`open`); `view` starts from a saved view,
 * `project` preselects the project to save into.
 */
export function benchFor(r: {
  fingerprint: string;
  demoFile?: string | null;
  viewId?: number;
  projectId?: number;
  /** Runs to compare with it: library fingerprints, and demo files fetched from the server */
  compare?: { fingerprints: string[]; demoFiles: string[] };
}): string {
  const q = new URLSearchParams();
  if (r.demoFile) q.set('demo', r.demoFile);
  else q.set('open', r.fingerprint);
  if (r.viewId !== undefined) q.set('view', String(r.viewId));
  if (r.projectId !== undefined) q.set('project', String(r.projectId));
  if (r.compare?.fingerprints.length) q.set('with', r.compare.fingerprints.join(','));
  if (r.compare?.demoFiles.length) q.set('withDemo', r.compare.demoFiles.join(','));
  return `${paths.bench}?${q.toString()}`;
}

/** Sign in, then come back to `next` (a same-site path). */
export const signInThen = (next: string) => `${paths.signIn}?next=${encodeURIComponent(next)}`;

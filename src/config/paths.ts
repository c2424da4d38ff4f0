export const paths = {
  signIn: '/signin',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  invitation: (token: string) => `/invitations/${token}`,
  projects: '/projects',
  project: (id: number | string) => `/projects/${id}`,
  bench: '/bench',
  /** A saved view; `mark` selects one of its marks. */
  view: (id: number | string, mark?: number) => (mark === undefined ? `/views/${id}` : `/views/${id}?mark=${mark}`),
  shared: (token: string) => `/shared/${token}`,
  settings: '/settings',
  adminUsers: '/admin/users',
  outbox: '/outbox',
} as const;

/** Sign in, then come back to `next` (a same-site path). */
export const signInThen = (next: string) => `${paths.signIn}?next=${encodeURIComponent(next)}`;

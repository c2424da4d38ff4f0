export const paths = {
  signIn: '/signin',
  projects: '/projects',
  project: (id: number | string) => `/projects/${id}`,
} as const;

/**
 * The demo's invented scenario: Corvale Drives (an invented company) validating its invented CA-7
 * e-axle (a permanent-magnet traction motor with an integrated silicon-carbide inverter). Every name
 * here is made up for the demo.
 */
import type { ProjectRole } from '../server/schemas/projects';
import type { SiteRole } from '../server/schemas/auth';

export const DEMO_PASSWORD = 'fanlight-demo';

export interface DemoAccount {
  email: string;
  name: string;
  siteRole: SiteRole;
  /** Role on the demo project, or null for the site admin, who manages users and is no member. */
  projectRole: ProjectRole | null;
}

export const demoAccounts: DemoAccount[] = [
  { email: 'admin@fanlight.test', name: 'Ada Okonkwo-Lind', siteRole: 'admin', projectRole: null },
  { email: 'lead@fanlight.test', name: 'Lena Marsh', siteRole: 'staff', projectRole: 'lead' },
  { email: 'engineer@fanlight.test', name: 'Tomas Irvine', siteRole: 'staff', projectRole: 'engineer' },
  { email: 'viewer@fanlight.test', name: 'Priya Holm', siteRole: 'guest', projectRole: 'viewer' },
];

export const demoProject = {
  name: 'CA-7 e-axle validation',
  description:
    'Corvale Drives CA-7 e-axle on the dynamometer: run-ups and coast-downs to 12 000 rpm, inverter ' +
    'housing accelerometer, microphone at 1 m, 60-pulse tacho. Goal: separate carrier noise from motor orders.',
};

import { DEMO_PASSWORD, demoAccounts } from '../../seeds/demo-scenario';

export function printBanner(url: string, extras: string[] = []): void {
  const lines = [
    '',
    `  Fanlight is running on ${url}`,
    '',
    `  Demo accounts (password "${DEMO_PASSWORD}"):`,
    ...demoAccounts.map((a) => `    ${a.email.padEnd(26)} ${a.siteRole}${a.projectRole ? `, ${a.projectRole} of the demo project` : ''}`),
    ...extras,
    '',
    '  Ctrl-C stops the app and its database.',
    '',
  ];
  console.log(lines.join('\n'));
}

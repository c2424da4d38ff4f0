import type { OutgoingMail } from './mailer';

export function invitationMail(p: {
  to: string;
  projectName: string;
  inviterName: string;
  role: string;
  link: string;
  expiresAt: Date;
}): OutgoingMail {
  return {
    to: p.to,
    subject: `${p.inviterName} invited you to ${p.projectName} on Fanlight`,
    text: [
      `${p.inviterName} invited you to the project "${p.projectName}" on Fanlight, as ${p.role}.`,
      '',
      'Open this link to accept (it works once, until ' + p.expiresAt.toISOString().slice(0, 16).replace('T', ' ') + ' UTC):',
      p.link,
      '',
      'If you did not expect this invitation, ignore this mail.',
    ].join('\n'),
  };
}

export function passwordResetMail(p: { to: string; name: string; link: string }): OutgoingMail {
  return {
    to: p.to,
    subject: 'Reset your Fanlight password',
    text: [
      `Hello ${p.name},`,
      '',
      'Someone asked to reset the password of your Fanlight account. To choose a new one, open this link',
      '(it works once, for one hour):',
      p.link,
      '',
      'If it was not you, ignore this mail: your password stays as it is.',
    ].join('\n'),
  };
}

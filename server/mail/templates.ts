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

const excerpt = (text: string, max = 600) => (text.length > max ? `${text.slice(0, max - 1)}…` : text);
const quoted = (text: string) =>
  excerpt(text)
    .split('\n')
    .map((line) => `> ${line}`)
    .join('\n');
const SETTINGS_NOTE = 'You get this mail because of your notification settings in Fanlight; you can turn this kind off there.';

/** Someone commented on your mark or on your view. */
export function replyMail(p: {
  to: string;
  name: string;
  actorName: string;
  viewTitle: string;
  onMark: boolean;
  body: string;
  link: string;
}): OutgoingMail {
  const where = p.onMark ? `your mark in "${p.viewTitle}"` : `your view "${p.viewTitle}"`;
  return {
    to: p.to,
    subject: `${p.actorName} replied on ${where}`,
    text: [`Hello ${p.name},`, '', `${p.actorName} replied on ${where}:`, '', quoted(p.body), '', 'Open the thread:', p.link, '', SETTINGS_NOTE].join(
      '\n',
    ),
  };
}

/** Someone wrote your @handle in a mark or a comment. */
export function mentionMail(p: { to: string; name: string; actorName: string; viewTitle: string; body: string; link: string }): OutgoingMail {
  return {
    to: p.to,
    subject: `${p.actorName} mentioned you in "${p.viewTitle}"`,
    text: [`Hello ${p.name},`, '', `${p.actorName} mentioned you in the view "${p.viewTitle}":`, '', quoted(p.body), '', 'Open it here:', p.link, '', SETTINGS_NOTE].join(
      '\n',
    ),
  };
}

/** A member sent you a view. */
export function shareMail(p: { to: string; name: string; actorName: string; viewTitle: string; projectName: string; link: string }): OutgoingMail {
  return {
    to: p.to,
    subject: `${p.actorName} shared the view "${p.viewTitle}" with you`,
    text: [
      `Hello ${p.name},`,
      '',
      `${p.actorName} shared the view "${p.viewTitle}" of the project "${p.projectName}" with you.`,
      '',
      'Open the view:',
      p.link,
      '',
      SETTINGS_NOTE,
    ].join('\n'),
  };
}

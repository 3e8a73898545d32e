import type { Mail } from '@/server/auth/mailer';
import { isTeamRole, roleLabels } from '@/server/contracts/roles';

/** The mails sign-in and Teams send, in our words. */

export function verificationMail(m: { to: string; name: string; url: string; hours: number }): Mail {
  return {
    to: m.to,
    subject: 'Confirm your e-mail address for Cyclemoot',
    text:
      `Hello ${m.name},\n\n` +
      `Open this link to confirm that this address is yours and to sign in to Cyclemoot:\n${m.url}\n\n` +
      `The link works once and expires in ${m.hours} hours. If you did not create an account, ignore this e-mail: ` +
      `nothing happens without the link.`,
  };
}

export function accountExistsMail(m: { to: string; name: string; signInURL: string }): Mail {
  return {
    to: m.to,
    subject: 'Someone tried to create a Cyclemoot account with your address',
    text:
      `Hello ${m.name},\n\n` +
      `Someone tried to create a new Cyclemoot account with this e-mail address, which already has one. ` +
      `Nothing was changed. If it was you, sign in instead: ${m.signInURL}\n\n` +
      `If it was not you, you need not do anything.`,
  };
}

export function invitationMail(m: {
  to: string;
  inviter: { name: string; email: string };
  teamName: string;
  role: string;
  link: string;
}): Mail {
  const role = isTeamRole(m.role) ? roleLabels[m.role] : m.role;
  return {
    to: m.to,
    subject: `${m.inviter.name} invited you to ${m.teamName} on Cyclemoot`,
    text:
      `${m.inviter.name} (${m.inviter.email}) invited you to join the Team "${m.teamName}" on Cyclemoot as ${role}.\n\n` +
      `Open this link to accept: ${m.link}\n\n` +
      `The invitation expires in 7 days. If you did not expect it, ignore this e-mail.`,
  };
}

import type { MailMessage } from './mailer'

// Plain-text mail first: it reads everywhere and the links stay copyable. Each builder returns a
// whole message so wording lives in one place.

const SIGNATURE = '\n\n-- \nSonoweave: Brillouin experiments, simulated and kept for your group.'

export function confirmationMail(to: string, link: string): MailMessage {
  return {
    to,
    subject: 'Confirm your e-mail address for Sonoweave',
    text: `Welcome to Sonoweave.\n\nConfirm that this address is yours by opening:\n\n${link}\n\nThe link works for 3 days. If you did not sign up, ignore this message.${SIGNATURE}`,
  }
}

/** Sent to an address that already has an account when someone signs up with it again. */
export function alreadyRegisteredMail(to: string, resetLink: string): MailMessage {
  return {
    to,
    subject: 'You already have a Sonoweave account',
    text: `Someone (perhaps you) tried to sign up with this address, which already has an account.\n\nIf you forgot your password, choose a new one here (the link works for 1 hour):\n\n${resetLink}\n\nIf it was not you, ignore this message; nothing has changed.${SIGNATURE}`,
  }
}

export function passwordResetMail(to: string, link: string): MailMessage {
  return {
    to,
    subject: 'Reset your Sonoweave password',
    text: `Choose a new password by opening:\n\n${link}\n\nThe link works once, for 1 hour. Signing in with the new password ends every other session.\nIf you did not ask for this, ignore this message; your password stays as it is.${SIGNATURE}`,
  }
}

export function invitationMail(to: string, opts: { groupName: string; role: string; inviter: string; link: string }): MailMessage {
  return {
    to,
    subject: `${opts.inviter} invited you to ${opts.groupName} on Sonoweave`,
    text: `${opts.inviter} invited you to join the research group "${opts.groupName}" as ${opts.role}.\n\nAccept by opening this link and signing in (or signing up) as ${to}:\n\n${opts.link}\n\nThe invitation expires in 7 days.${SIGNATURE}`,
  }
}

export function runFinishedMail(to: string, opts: { title: string; url: string; summary: string }): MailMessage {
  return {
    to,
    subject: `Finished: ${opts.title}`,
    text: `${opts.summary}\n\nOpen it: ${opts.url}\n\nYou get this because you started it. Turn these messages off under your account menu, "Mail me when my runs finish".${SIGNATURE}`,
  }
}

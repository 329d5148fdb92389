import { htmlFromText } from './mail-html'
import type { MailMessage } from './mailer'

// Plain-text mail first: it reads everywhere and the links stay copyable; the HTML part is made from
// it so every link is also clickable. Each builder returns a whole message so wording lives in one place.

const withHtml = (m: Omit<MailMessage, 'html'>): MailMessage => ({ ...m, html: htmlFromText(m.text) })

const SIGNATURE = '\n\n-- \nSonoweave: Brillouin experiments, simulated and kept for your group.'

export function confirmationMail(to: string, link: string): MailMessage {
  return withHtml({
    to,
    subject: 'Confirm your e-mail address for Sonoweave',
    text: `Welcome to Sonoweave.\n\nConfirm that this address is yours by opening:\n\n${link}\n\nThe link works for 3 days. If you did not sign up, ignore this message.${SIGNATURE}`,
  })
}

/** Sent to an address that already has an account when someone signs up with it again. */
export function alreadyRegisteredMail(to: string, resetLink: string): MailMessage {
  return withHtml({
    to,
    subject: 'You already have a Sonoweave account',
    text: `Someone (perhaps you) tried to sign up with this address, which already has an account.\n\nIf you forgot your password, choose a new one here (the link works for 1 hour):\n\n${resetLink}\n\nIf it was not you, ignore this message; nothing has changed.${SIGNATURE}`,
  })
}

export function passwordResetMail(to: string, link: string): MailMessage {
  return withHtml({
    to,
    subject: 'Reset your Sonoweave password',
    text: `Choose a new password by opening:\n\n${link}\n\nThe link works once, for 1 hour. Signing in with the new password ends every other session.\nIf you did not ask for this, ignore this message; your password stays as it is.${SIGNATURE}`,
  })
}

export function invitationMail(to: string, opts: { groupName: string; role: string; inviter: string; link: string }): MailMessage {
  return withHtml({
    to,
    subject: `${opts.inviter} invited you to ${opts.groupName} on Sonoweave`,
    text: `${opts.inviter} invited you to join the research group "${opts.groupName}" as ${opts.role}.\n\nAccept by opening this link and signing in (or signing up) as ${to}:\n\n${opts.link}\n\nThe invitation expires in 7 days.${SIGNATURE}`,
  })
}

/** A run or sweep of the recipient's finished; settingsUrl is the absolute link to their mail settings. */
export function runFinishedMail(to: string, opts: { title: string; url: string; summary: string; settingsUrl: string; what: string }): MailMessage {
  return withHtml({
    to,
    subject: `Finished: ${opts.title}`,
    text: `${opts.summary}\n\nOpen it: ${opts.url}\n\nYou get this because you started it. Choose which mails you get (${opts.what} among them) in your account settings: ${opts.settingsUrl}${SIGNATURE}`,
  })
}

/** The new address must prove it reads its mail before the account moves to it. */
export function emailChangeMail(to: string, link: string): MailMessage {
  return withHtml({
    to,
    subject: 'Confirm your new e-mail address for Sonoweave',
    text: `Someone (perhaps you) asked to use this address for a Sonoweave account.\n\nConfirm by opening:\n\n${link}\n\nThe account keeps its old address until you do. The link works for 3 days; if you did not ask for this, ignore this message.${SIGNATURE}`,
  })
}

/** Told to the old address once the change is made, so a taken-over account does not go unnoticed. */
export function emailChangedNoticeMail(to: string, newEmail: string): MailMessage {
  return withHtml({
    to,
    subject: 'Your Sonoweave e-mail address was changed',
    text: `Your Sonoweave account now uses ${newEmail}; mail no longer comes to this address.\n\nIf you did not make this change, reset your password from the sign-in page and tell your group's owner.${SIGNATURE}`,
  })
}

export function roleChangedMail(to: string, opts: { groupName: string; role: string; by: string; groupUrl: string; settingsUrl: string }): MailMessage {
  return withHtml({
    to,
    subject: `Your role in ${opts.groupName} is now ${opts.role}`,
    text: `${opts.by} made you ${opts.role} of the research group "${opts.groupName}".\n\nSee the group: ${opts.groupUrl}\n\nChoose which mails you get in your account settings: ${opts.settingsUrl}${SIGNATURE}`,
  })
}

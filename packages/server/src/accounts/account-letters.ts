import { type Letter, letter } from '../mail/letters';

/** The account e-mails. Links are built by the caller from PUBLIC_BASE_URL, never from a request. */
export const accountLetters = {
  verifyEmail: (name: string, url: string): Letter =>
    letter({
      subject: 'Confirm your e-mail address for Beadroll',
      greeting: `Hello ${name},`,
      paragraphs: [
        'Thank you for applying for a Beadroll account. Please confirm that this address is yours.',
        'After that, the registrar checks your application; you can sign in and read in the meantime.',
        'The link works once, for 24 hours.',
      ],
      action: { label: 'Confirm my e-mail address', url },
      why: 'You got this because someone signed up for Beadroll with this address. If it was not you, ignore it.',
    }),

  alreadyRegistered: (name: string, url: string): Letter =>
    letter({
      subject: 'Someone tried to sign up for Beadroll with your address',
      greeting: `Hello ${name},`,
      paragraphs: [
        'Someone tried to open a new Beadroll account with this e-mail address, which already has one. No second account was made.',
        'If it was you and you have forgotten your password, you can choose a new one.',
      ],
      action: { label: 'Choose a new password', url },
      why: 'You got this because this address belongs to a Beadroll account. If it was not you, nothing has changed.',
    }),

  resetPassword: (name: string, url: string): Letter =>
    letter({
      subject: 'Choose a new Beadroll password',
      greeting: `Hello ${name},`,
      paragraphs: [
        'Someone asked to reset the password of your Beadroll account.',
        'The link works once, for one hour. Choosing a new password signs you out everywhere.',
      ],
      action: { label: 'Choose a new password', url },
      why: 'You got this because a password reset was asked for this address. If it was not you, ignore it: your password stays as it is.',
    }),

  setPassword: (url: string): Letter =>
    letter({
      subject: 'Your Beadroll registrar account',
      greeting: 'Hello,',
      paragraphs: [
        'A registrar account was created for this address. Choose its password to start.',
        'The link works once, for 72 hours.',
      ],
      action: { label: 'Choose my password', url },
      why: 'You got this because the operator of this Beadroll server created a registrar account for this address.',
    }),

  newApplication: (applicant: string, business: string, url: string): Letter =>
    letter({
      subject: `New account to verify: ${applicant}`,
      greeting: 'Hello,',
      paragraphs: [
        `${applicant} (${business}) has confirmed their e-mail address and waits for verification.`,
      ],
      action: { label: 'Open the verification queue', url },
      why: 'You got this because you are a registrar of this Beadroll server.',
    }),

  approved: (name: string, url: string): Letter =>
    letter({
      subject: 'Your Beadroll account is verified',
      greeting: `Hello ${name},`,
      paragraphs: ['The registrar has verified your account. You can now write to rolls.'],
      action: { label: 'Sign in', url },
      why: 'You got this because you applied for a Beadroll account.',
    }),

  rejected: (name: string, reason: string): Letter =>
    letter({
      subject: 'Your Beadroll application was not accepted',
      greeting: `Hello ${name},`,
      paragraphs: [
        'The registrar did not verify your account, for this reason:',
        reason,
        'You can still sign in and read. Reply to the registrar if you can add what was missing.',
      ],
      why: 'You got this because you applied for a Beadroll account.',
    }),

  suspended: (name: string, reason: string): Letter =>
    letter({
      subject: 'Your Beadroll account is suspended',
      greeting: `Hello ${name},`,
      paragraphs: [
        'The registrar has suspended your account, for this reason:',
        reason,
        'You can sign in and read, but not write to any roll. You were signed out everywhere.',
      ],
      why: 'You got this because you hold a Beadroll account.',
    }),

  reinstated: (name: string): Letter =>
    letter({
      subject: 'Your Beadroll account is active again',
      greeting: `Hello ${name},`,
      paragraphs: ['The registrar has lifted the suspension of your account. You can write to rolls again.'],
      why: 'You got this because you hold a Beadroll account.',
    }),
};

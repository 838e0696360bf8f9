import { formatLotCode } from '@beadroll/core';
import { type Letter, letter } from '../mail/letters';

const CATEGORY_WORDS: Record<string, string> = {
  'wrong-attribution': 'a wrong attribution claim',
  counterfeit: 'a suspected counterfeit or imitation',
  'personal-data': 'personal data on the page',
  other: 'another problem',
};

/** E-mails of the registrar's tools. The reporter's address never goes into a letter to anyone else. */
export const registryLetters = {
  reportOnYourLot: (name: string, code: string, category: string, text: string, url: string): Letter =>
    letter({
      subject: `A problem was reported on lot ${formatLotCode(code)}`,
      greeting: `Hello ${name},`,
      paragraphs: [
        `Someone reported ${CATEGORY_WORDS[category] ?? 'a problem'} on the public page of lot ${formatLotCode(code)}, which you hold. The registrar will look at it.`,
        `What they wrote: “${text}”`,
        'You need not do anything now. If the registrar needs something from you, they will write.',
      ],
      action: { label: 'Open the public page', url },
      why: 'You got this because you hold this lot on Beadroll. Who sent the report is not shared.',
    }),

  reportAnswered: (code: string, resolution: string): Letter =>
    letter({
      subject: `Your report on lot ${formatLotCode(code)}`,
      greeting: 'Hello,',
      paragraphs: [
        `Thank you for reporting a problem on the public page of lot ${formatLotCode(code)}. The registrar has looked at it.`,
        `The registrar’s answer: “${resolution}”`,
      ],
      why: 'You got this because you left this address with a report on Beadroll. It is used for nothing else.',
    }),

  accountClosed: (name: string): Letter =>
    letter({
      subject: 'Your Beadroll account is closed',
      greeting: `Hello ${name},`,
      paragraphs: [
        'Your Beadroll account is closed. Your name and contact details are removed, and the private details you recorded are deleted.',
        'The entries you wrote stay on their lots’ rolls under an anonymous account number, so every history still checks out; public pages show them as written by a former dealer.',
      ],
      why: 'You got this because this address belonged to the account that was closed.',
    }),
};

import { formatLotCode } from '@beadroll/core';
import { type Letter, letter } from '../mail/letters';

/** A lot as a letter names it: its title and grouped code. */
export interface LetterLot {
  code: string;
  title: string;
}

const named = (l: LetterLot) => `"${l.title || 'a lot'}" (${formatLotCode(l.code)})`;
const TRADE = 'You got this because you take part in this transfer on Beadroll.';

/**
 * The transfer and sale e-mails. They never carry a price or any other sealed detail; links are
 * built by the caller from PUBLIC_BASE_URL.
 */
export const transferLetters = {
  offerReceived: (name: string, from: string, lot: LetterLot, url: string, note?: string): Letter =>
    letter({
      subject: `${from} offers you a lot: ${lot.title}`,
      greeting: `Hello ${name},`,
      paragraphs: [
        `${from} offers to pass you the lot ${named(lot)} on Beadroll.`,
        ...(note ? [`Their note: ${note}`] : []),
        'Open the offer to see the lot, its history and any price you agreed, then accept or decline it. If nobody answers, the offer lapses.',
      ],
      action: { label: 'Open the offer', url },
      why: TRADE,
    }),

  offerSent: (name: string, to: string, lot: LetterLot, url: string): Letter =>
    letter({
      subject: `Your offer to ${to}: ${lot.title}`,
      greeting: `Hello ${name},`,
      paragraphs: [
        `You offered the lot ${named(lot)} to ${to}. It stays yours until they accept.`,
        'You can withdraw the offer until it is answered.',
      ],
      action: { label: 'Open the offer', url },
      why: TRADE,
    }),

  offerEnded: (
    name: string,
    outcome: 'accepted' | 'declined' | 'withdrawn' | 'lapsed',
    who: { offerer: string; recipient: string },
    lot: LetterLot,
    url: string,
    note?: string,
  ): Letter => {
    const line = {
      accepted: `${who.recipient} accepted the offer of ${named(lot)} from ${who.offerer}. ${who.recipient} now holds the lot.`,
      declined: `${who.recipient} declined the offer of ${named(lot)} from ${who.offerer}. ${who.offerer} still holds the lot.`,
      withdrawn: `${who.offerer} withdrew the offer of ${named(lot)} to ${who.recipient}. ${who.offerer} still holds the lot.`,
      lapsed: `The offer of ${named(lot)} from ${who.offerer} to ${who.recipient} lapsed without an answer. ${who.offerer} still holds the lot.`,
    }[outcome];
    return letter({
      subject: `Offer ${outcome}: ${lot.title}`,
      greeting: `Hello ${name},`,
      paragraphs: [line, ...(note ? [`Note: ${note}`] : []), 'Both sides are on the lot’s roll.'],
      action: { label: 'Open the lot', url },
      why: TRADE,
    });
  },

  invitation: (from: string, business: string, lot: LetterLot, url: string, hasAccount: boolean): Letter =>
    letter({
      subject: `${from} wants to pass you a lot of glass beads on Beadroll`,
      greeting: 'Hello,',
      paragraphs: [
        `${from} (${business}) would like to offer you the lot ${named(lot)} through Beadroll, where each lot keeps its own history.`,
        hasAccount
          ? 'Your dealer account is waiting for the registrar. Once it is verified, the offer will be waiting for you under Incoming offers.'
          : 'Apply for a dealer account with this e-mail address. Once the registrar has verified it, the offer will be waiting for you under Incoming offers.',
      ],
      ...(hasAccount ? {} : { action: { label: 'Apply for a dealer account', url } }),
      why: `You got this because ${from} typed this address when offering a lot. Beadroll keeps the address only until the offer is made, and never writes it on a lot's history.`,
    }),

  invitationStalled: (name: string, lot: LetterLot, reason: string, url: string): Letter =>
    letter({
      subject: `Your invitation could not become an offer: ${lot.title}`,
      greeting: `Hello ${name},`,
      paragraphs: [
        `The dealer you invited to take ${named(lot)} is now verified, but the offer could not be made: ${reason}`,
        'You can try again from your list of invitations.',
      ],
      action: { label: 'Open my invitations', url },
      why: TRADE,
    }),

  receipt: (seller: string, business: string, lot: LetterLot, date: string, url: string): Letter =>
    letter({
      subject: `Your receipt from ${business}: ${lot.title}`,
      greeting: 'Hello,',
      paragraphs: [
        `Thank you for buying ${named(lot)} from ${seller} (${business}) on ${date}.`,
        'The lot’s history — where it came from, the evidence and every opinion on it — stays online. Anyone can check it against its hash chain.',
      ],
      action: { label: 'See the lot’s history', url },
      why: `You got this because ${seller} typed this address when recording the sale. Beadroll used it once for this receipt and did not keep it.`,
    }),
};

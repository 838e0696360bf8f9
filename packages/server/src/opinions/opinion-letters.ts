import { formatLotCode, periodWords, type OpinionBody } from '@beadroll/core';
import { type Letter, letter } from '../mail/letters';

const ORIGIN_WORDS: Record<OpinionBody['origin'], string> = {
  'venice-murano': 'Venice / Murano',
  'bohemia-czech': 'Bohemia / Czech lands',
  india: 'India',
  china: 'China',
  japan: 'Japan',
  'other-european': 'other European',
  unknown: 'unknown',
  other: 'other',
};

/** The opinion e-mails. Links are built from PUBLIC_BASE_URL by the caller. */
export const opinionLetters = {
  newDissent: (
    holderName: string,
    lot: { code: string; title: string },
    author: string,
    opinion: OpinionBody,
    url: string,
  ): Letter =>
    letter({
      subject: `A dissent on your lot ${formatLotCode(lot.code)}`,
      greeting: `Hello ${holderName},`,
      paragraphs: [
        `${author} recorded an opinion on “${lot.title}” (${formatLotCode(lot.code)}) that disagrees with your attribution: ${ORIGIN_WORDS[opinion.origin]}${opinion.originNote ? ` (${opinion.originNote})` : ''}, ${periodWords(opinion.period)}.`,
        'It is shown beside your attribution on the lot page and on its public page. You may answer it there; the answer goes on the roll as a note.',
      ],
      action: { label: 'Open the lot', url },
      why: 'You got this because you hold this lot on Beadroll.',
    }),
  opinionAsked: (
    assessorName: string,
    lot: { code: string; title: string },
    dealer: string,
    note: string | null,
    url: string,
  ): Letter =>
    letter({
      subject: `A dealer asks your opinion on lot ${formatLotCode(lot.code)}`,
      greeting: `Hello ${assessorName},`,
      paragraphs: [
        `${dealer} asks for your opinion on “${lot.title}” (${formatLotCode(lot.code)}).${note ? ` Their note: “${note}”` : ''}`,
        'The request waits in your queue on your start page. While it is open you can read the lot, even when it has no public page, and record your opinion and its evidence there.',
      ],
      action: { label: 'Open your queue', url },
      why: 'You got this because a dealer named you as the assessor to ask on Beadroll.',
    }),
};

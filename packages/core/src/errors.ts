/**
 * Base class of every error thrown by @beadroll/core. `code` is a stable, machine-readable
 * string (`C`, the subclass's own codes); `message` is for people. Callers branch on `code` (or on
 * the subclass), never on text.
 */
export class LedgerError<C extends string = string> extends Error {
  readonly code: C;
  constructor(code: C, message: string) {
    super(message);
    this.name = new.target.name;
    this.code = code;
  }
}

/** Codes of {@link CanonicalError}. */
export type CanonicalErrorCode = 'not-json' | 'non-canonical' | 'unsafe-number' | 'unsupported-value';

/**
 * Thrown when a value cannot be written as ledger canonical JSON, or a string is not the
 * canonical form of its own parse.
 */
export class CanonicalError extends LedgerError<CanonicalErrorCode> {}

/** One problem found in an input object: a dotted path (`description.count.value`) and why. */
export interface FieldIssue {
  path: string;
  message: string;
}

/**
 * Thrown when an entry draft, a body or a sealed field does not have the shape its kind
 * requires. `issues` names every offending field, so an API can answer 400 with all of them.
 */
export class ValidationError extends LedgerError {
  readonly issues: FieldIssue[];
  constructor(issues: FieldIssue[], code = 'invalid') {
    super(code, issues.map((i) => `${i.path || '(root)'}: ${i.message}`).join('; '));
    this.issues = issues;
  }
}

/** Codes of {@link LotCodeError}. */
export type LotCodeErrorCode = 'bad-length' | 'bad-symbol' | 'bad-check';

/** Thrown by lot-code parsing when the text is not a well-formed code with a matching check symbol. */
export class LotCodeError extends LedgerError<LotCodeErrorCode> {}

/** Codes of {@link MerkleError}. */
export type MerkleErrorCode = 'bad-size' | 'bad-index' | 'bad-proof' | 'bad-hash';

/** Thrown by Merkle functions for sizes or indices out of range and malformed proofs. */
export class MerkleError extends LedgerError<MerkleErrorCode> {}

/** Codes of {@link BundleError}. */
export type BundleErrorCode = 'not-utf8' | 'not-json' | 'not-a-bundle' | 'unknown-version' | 'too-large';

/** Thrown when a document is not a readable export bundle at all (as opposed to a broken roll). */
export class BundleError extends LedgerError<BundleErrorCode> {}

/** Codes of {@link TagError}. */
export type TagErrorCode = 'bad-host';

/** Thrown when a printed tag cannot be made from its parts, such as a host that is not a host. */
export class TagError extends LedgerError<TagErrorCode> {}

/** Codes of {@link NoteError}. */
export type NoteErrorCode = 'bad-note' | 'bad-key' | 'bad-checkpoint' | 'bad-signature';

/** Thrown when a signed note, a verifier key or a checkpoint text is malformed. */
export class NoteError extends LedgerError<NoteErrorCode> {}

import type {
  BodyFields,
  EntryKind,
  LotDescription,
  ParentRef,
  RollState,
  SealedFieldName,
  SealedValues,
} from '@beadroll/core';

/** What a feature asks to append to an existing roll. */
export interface AppendDraft<K extends EntryKind = EntryKind> {
  kind: K;
  /** Opaque account id of the writer (Principal.id, or core's SYSTEM_ACTOR). */
  actor: string;
  /** The body without its nonce; core adds the nonce and checks the shape. */
  body: BodyFields<K>;
  /** Private values to commit on this entry (core's sealed fields). */
  sealed?: SealedValues;
  /**
   * Accounts besides the actor that may read the sealed values, per field (for example the
   * recipient of a transfer for `transfer-price`). Nobody else ever reads them.
   */
  sealedAlsoVisibleTo?: Partial<Record<SealedFieldName, string[]>>;
}

/** What a feature asks to open a new roll with (a `registered` entry). */
export interface RegisterDraft {
  /** Canonical code; drawn with the ledger's random source when omitted. */
  code?: string;
  actor: string;
  description: LotDescription;
  /** Parent `split`/`combined` entries, for a child lot. */
  parents?: ParentRef[];
  sealed?: SealedValues;
  sealedAlsoVisibleTo?: Partial<Record<SealedFieldName, string[]>>;
}

/** An entry that was written. */
export interface AppendedEntry {
  lot: string;
  seq: number;
  kind: EntryKind;
  hash: string;
  time: string;
  actor: string;
  header: string;
  body: string;
  /** The lot's derived state after this entry. */
  state: RollState;
}

/** Called inside the append transaction after each entry, to keep derived tables in step. */
export interface RollProjector {
  project(tx: import('typeorm').EntityManager, lotId: string, entry: AppendedEntry): Promise<void>;
}

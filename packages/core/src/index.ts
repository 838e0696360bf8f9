export { sha256HexOfText, sha256HexOfBytes, DOMAIN, domainHash, entryHash, bodyDigest } from './hash.js';
export type { Domain } from './hash.js';
export {
  LedgerError,
  CanonicalError,
  ValidationError,
  LotCodeError,
  MerkleError,
  BundleError,
  TagError,
  NoteError,
} from './errors.js';
export type {
  CanonicalErrorCode,
  FieldIssue,
  LotCodeErrorCode,
  MerkleErrorCode,
  BundleErrorCode,
  TagErrorCode,
  NoteErrorCode,
} from './errors.js';
export { canonicalise, canonicaliseJcs, parseCanonical } from './canonical.js';
// Installs the direct reading of usual headers in Node; bundles for browsers leave it out.
import './usual-header.js';
export { secureRandom, seededRandom } from './random.js';
export type { RandomSource } from './random.js';
export type { TagMatch } from './lotcode.js';
export {
  CROCKFORD_ALPHABET,
  CROCKFORD_CHECK_EXTRA,
  crockfordCheckSymbol,
  generateLotCode,
  parseLotCode,
  isLotCode,
  isCanonicalLotCode,
  formatLotCode,
  TAG_REF_SYMBOLS,
  tagReference,
  parseTagReference,
  findEntriesByTagReference,
  matchTag,
} from './lotcode.js';
export * from './types.js';
export {
  LIMITS,
  isHex64,
  isActorId,
  isEntryTime,
  isCalendarDate,
  bodyIssues,
  assertBody,
  sealedValueIssues,
  factsIssues,
} from './validate.js';
export { factsOf } from './facts.js';
export {
  sealedFieldCommitment,
  sealedRoot,
  sealFields,
  discloseSealedField,
  verifySealedDisclosure,
  openSealedFields,
} from './sealed.js';
export type { SealedField, SealedSet, SealedDisclosure } from './sealed.js';
export {
  HEADER_KEYS,
  VERSION_2_KINDS,
  VERSION_3_KINDS,
  kindSince,
  NEVER_REDACTED,
  REASON_CODES,
  buildEntry,
  headOf,
  decodeHeader,
  isHeaderProblem,
  encodeHeader,
} from './entry.js';
export type { StoredEntry, EntryDraft, BuiltEntry, ReasonCode, HeaderProblem } from './entry.js';
export {
  FINAL_STATUSES,
  TRANSITION_RULES,
  VOID_WINDOW_MS,
  checkTransition,
  requestFor,
  isReservedActor,
  opinionsDisagree,
  reduceEntry,
  reduceEntryInPlace,
  reduceRoll,
} from './rules.js';
export type {
  LotStatus,
  RollHead,
  OpinionRecord,
  OpenOffer,
  OpenRequest,
  ChildLink,
  RollState,
  TransitionDraft,
  TransitionResult,
  ActorRule,
  TransitionRule,
  ReducibleEntry,
} from './rules.js';
export { mayAppend, allowedActions } from './permissions.js';
export type { Permission, PermissionContext } from './permissions.js';
export { RollVerifier, createRollVerifier, verifyRoll } from './verify.js';
export type {
  VerifyFailure,
  VerifySuccess,
  RollVerification,
  VerifiedEntry,
  RollVerificationWithEntries,
  UncheckedRule,
} from './verify.js';
export {
  EMPTY_TREE_HASH,
  merkleLeafHash,
  merkleNodeHash,
  merkleRoot,
  inclusionProof,
  consistencyProof,
  verifyInclusion,
  verifyConsistency,
} from './merkle.js';
export { MerkleTree } from './merkle-tree.js';
export {
  NOTE_SIG_ED25519,
  NOTE_SIG_COSIGNATURE,
  base64Encode,
  base64Decode,
  isKeyName,
  noteKeyId,
  formatVerifierKey,
  parseVerifierKey,
  noteSigner,
  ed25519PublicKey,
  ed25519Sign,
  ed25519Verify,
  parseNote,
  signatureLine,
  signNote,
  addSignatures,
  verifyNoteSignature,
  formatCheckpoint,
  parseCheckpoint,
  cosignatureMessage,
  cosignatureLine,
  verifyCosignature,
  openCheckpoint,
} from './note.js';
export type {
  VerifierKey,
  NoteSigner,
  NoteSignature,
  ParsedNote,
  Checkpoint,
  VerifiedCheckpoint,
} from './note.js';
export {
  LOG_ORIGIN_SUFFIX,
  logOrigin,
  entryLeafHash,
  decodeProof,
  checkInclusion,
  checkConsistency,
  hashHex,
  verifyBundleCheckpoint,
} from './log.js';
export type {
  LogInclusion,
  BundleCheckpoint,
  InclusionCheck,
  BundleInclusionResult,
  BundleCheckpointResult,
} from './log.js';
export {
  BUNDLE_FORMAT,
  BUNDLE_VERSION,
  BUNDLE_VERSIONS,
  DEFAULT_MAX_BUNDLE_BYTES,
  parseBundle,
  parseBundleText,
  parseBundleBytes,
  verifyBundle,
  createBundle,
} from './bundle.js';
export type {
  BundleEntry,
  BundleRoll,
  BundleScope,
  Bundle,
  BundleRollResult,
  BundleVerification,
} from './bundle.js';
export {
  INHERITED_SCOPE,
  INHERITED_SCOPE_KINDS,
  verifyInheritedRoll,
  inheritedRecord,
  holdersBySeq,
  attributionOnRecord,
} from './inherited.js';
export type {
  InheritedRollInput,
  InheritedBundleInput,
  InheritedEntry,
  LeftBy,
  WeighedOpinion,
  RecordSource,
  AttributionOnRecord,
} from './inherited.js';
export { printedTagCode, readTagCode, checkTagCode } from './tagcode.js';
export type { TypedTagCode, TagCodeCheck } from './tagcode.js';
export {
  QR_ALPHANUMERIC_CHARSET,
  QR_ALPHANUMERIC_CAPACITY,
  QR_MAX_TABLED_VERSION,
  QR_QUIET_ZONE_MODULES,
  TAG_PATH_SEGMENT,
  isQrAlphanumeric,
  qrVersionForAlphanumeric,
  qrModulesPerSide,
  normaliseTagHost,
  tagPayload,
  parseTagPayload,
  tagQrVersion,
} from './tag.js';
export type { QrEcLevel, TagPayload } from './tag.js';
export {
  attributionAid,
  HANDLING_CAUTIONS,
  recordCautions,
  safetyCautions,
  safetyInputOf,
  uvCaution,
} from './aid.js';
export type { AidInput, AidResult, Indication, PlausibilityWarning } from './aid.js';
export {
  AID_DISCLAIMER,
  CAUTION_RULES,
  INDICATION_RULES,
  LEAD_WORDS,
  PERIOD_RULES,
  SOURCE_STANDINGS,
  URANIUM_WORDS,
  UV_A_POINTS,
} from './aid-rules.js';
export type {
  AidSource,
  AidCondition,
  CautionRule,
  IndicationRule,
  PeriodRule,
  SourceStanding,
} from './aid-rules.js';
export { periodWords, yearWords } from './period.js';
export {
  BOUNDS,
  CURRENCIES,
  EARLIEST_DATE,
  amountProblem,
  beadSizeProblem,
  bodyBoundIssues,
  countProblem,
  currencyOf,
  currencyProblem,
  dateProblem,
  descriptionIssues,
  moneyIssues,
  parseAmount,
  sealedBoundIssues,
  strandLengthProblem,
  yearProblem,
  yearText,
} from './bounds.js';
export type { Currency } from './bounds.js';

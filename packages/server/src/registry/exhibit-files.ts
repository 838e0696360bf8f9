/**
 * Deletes stored exhibit files (every stored version) by the SHA-256 that names them. The
 * exhibit store provides it; until one is set, redaction removes bodies only.
 */
export interface ExhibitFileRemover {
  removeAll(digests: string[]): Promise<void>;
}

export const NO_EXHIBIT_FILES: ExhibitFileRemover = { removeAll: async () => undefined };

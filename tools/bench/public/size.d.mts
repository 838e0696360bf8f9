export declare const BUDGET_BYTES: number;
export declare function entryAssets(html: string): string[];
export declare function measurePublicEntry(): {
  files: { file: string; raw: number; gzip: number; br: number | null }[];
  total: number;
};

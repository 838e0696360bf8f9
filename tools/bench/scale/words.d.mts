export declare const COLOURS: readonly string[];
export declare const WORDS: readonly string[];

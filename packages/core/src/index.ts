export { sha256HexOfText, sha256HexOfBytes } from './hash.js';

// ESM-only packages that Jest on Node 20 must transpile to CommonJS.
const esmOnly = [
  '@nestjs',
  '@noble',
  'canonicalize',
  'file-type',
  'strtok3',
  'token-types',
  '@tokenizer',
  'uint8array-extras',
  '@borewit',
  'nodemailer',
];
const swc = {
  jsc: {
    parser: { syntax: 'typescript', decorators: true },
    transform: { legacyDecorator: true, decoratorMetadata: true },
    target: 'es2022',
  },
  module: { type: 'commonjs' },
  sourceMaps: 'inline',
};
module.exports = {
  rootDir: '.',
  testEnvironment: 'node',
  testRegex: '(src|test)/.*\\.(spec|e2e-spec)\\.ts$',
  transform: { '^.+\\.(t|j|mj)s$': ['@swc/jest', swc] },
  transformIgnorePatterns: [`/node_modules/(?!(${esmOnly.join('|')})/)`],
  testTimeout: 60000,
};

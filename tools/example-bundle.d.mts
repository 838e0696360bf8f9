/** Builds the example bundle with the given core module (sources in tests, build in the script). */
export function buildExampleBundle(core: object): {
  format: string;
  version: number;
  rolls: unknown[];
  checkpoints: unknown[];
};

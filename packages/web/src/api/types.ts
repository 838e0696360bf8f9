// Type-only names for the generated API shapes: importing them adds nothing to a bundle.
import type { components } from './schema';

/** The shapes the server answers with, by their names in its OpenAPI document. */
export type Schemas = components['schemas'];

/**
 * A generated shape whose members named in `C` take core's types: where the document says only
 * "an object" (a lot description, observations, a bundle), core defines what is in it.
 */
export type WithCore<S, C> = Omit<S, keyof C> & C;

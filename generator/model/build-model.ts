/**
 * buildModel: a loaded scenario in, the bulletin model out, with the trend engine of
 * generator/stats (see assemble-model.ts for the steps). Pure and deterministic.
 */
import type { LoadedScenario } from '../scenario/types.ts';
import { assembleModel, type AssembleModelOptions, type BulletinModelSet } from './assemble-model.ts';
import { statsTrendEngine } from './trend-engine.ts';

export type { BulletinModelSet } from './assemble-model.ts';
export { generatorVersion } from './assemble-model.ts';

export interface BuildModelOptions extends AssembleModelOptions {
  /** Reserved for a cache of earlier results; unused for now. */
  previous?: unknown;
}

export function buildModel(scenario: LoadedScenario, options: BuildModelOptions = {}): BulletinModelSet {
  return assembleModel(scenario, statsTrendEngine, options);
}

/**
 * The steps a build runs, as functions: the command line passes the real ones (the scenario
 * reader, the model builder, Astro, pagefind); tests pass small stand-ins.
 */
import type { Bulletin, RegionSummary, SiteModel } from '../model/types.ts';
import type { LoadedScenario } from '../scenario/types.ts';

export interface ModelSet {
  site: SiteModel;
  regions: RegionSummary[];
  bulletins: Bulletin[];
}

export interface BuildSteps {
  load(dir: string, onProgress: (phase: string, done: number, total?: number) => void): Promise<LoadedScenario>;
  model(
    scenario: LoadedScenario,
    options: { cacheDir: string | null; onProgress: (done: number, total?: number) => void; log: (line: string) => void },
  ): Promise<ModelSet>;
  write(modelDir: string, set: ModelSet): Promise<void>;
  render(options: { modelDir: string; outDir: string; onPage: (done: number) => void }): Promise<{ pages: number }>;
  index(siteDir: string): Promise<void>;
}

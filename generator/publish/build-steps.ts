/**
 * Step: all of them: the step functions the conductor (build-release.ts) runs.
 * The steps a build runs, as functions: the command line passes the real ones (the scenario
 * reader, the model builder, Astro, pagefind); tests pass small stand-ins.
 */
import type { Bulletin, RegionSummary, SiteModel } from '../model/types.ts';
import type { LoadedScenario } from '../scenario/types.ts';
import type { WrittenBulletin } from '../model/written-bulletin.ts';
import type { SearchPart } from './render/search-index.ts';

export interface ModelSet {
  site: SiteModel;
  regions: RegionSummary[];
  bulletins: Bulletin[];
  /** Bulletins already written as model files (stable JSON), e.g. taken from the model memo. */
  written?: WrittenBulletin[];
  publisherLogo?: { file: string; bytes: Uint8Array };
}

export interface BuildSteps {
  /** `cacheDir`: where figures from earlier builds may be kept (null: read everything afresh). */
  load(dir: string, onProgress: (phase: string, done: number, total?: number) => void, cacheDir: string | null): Promise<LoadedScenario>;
  model(scenario: LoadedScenario, options: { cacheDir: string | null; onProgress: (done: number, total?: number) => void; log: (line: string) => void }): Promise<ModelSet>;
  write(modelDir: string, set: ModelSet): Promise<void>;
  /**
   * `only`: a JSON file listing the "season/segment" bulletins whose own pages to render (pages
   * about every bulletin are always rendered); absent: render everything.
   */
  render(options: { modelDir: string; outDir: string; onPage: (done: number) => void; only?: string }): Promise<{ pages: number }>;
  /** Builds the search index of each part into `<siteDir>/search-index/<part>/` (search-index.ts); `scratchDir` is free to use. */
  index(siteDir: string, parts: readonly SearchPart[], scratchDir: string): Promise<void>;
  /**
   * A hash of everything besides the model that pages depend on. Only a renderer that honours
   * `only` provides it; without it every build renders every page (see page-reuse.ts).
   */
  siteFingerprint?(): Promise<string>;
}

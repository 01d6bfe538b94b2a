/**
 * Child process for the kill test: starts a build into the folder given as the first argument,
 * prints "rendering" once half the pages are written, then waits to be killed.
 */
import { runBuild } from '../../../generator/cli/build.ts';
import { fakeSteps } from './fake-site.ts';

const out = process.argv[2];
if (!out) throw new Error('build-until-killed needs the output folder');
const steps = fakeSteps({
  values: { '2026-autumn/north-bay': 99 },
  midRender: async () => {
    process.stdout.write('rendering\n');
    await new Promise(() => {}); // never resolves: the test kills this process here
  },
});
process.exitCode = await runBuild(['--out', out, '--quiet', '--no-cache'], { steps });

// Builds, inside Chromium, the version-6 database the older app left after phone pendulum recordings
// (test/unit/store/phone-reanalysis-fixture.ts), under the app's own name, before the app first opens it.
// Bundled by test/e2e/bundle-for-page.ts and driven by test/e2e/reanalysis.e2e.ts.
import { buildV6 } from '../../unit/store/phone-reanalysis-fixture';

export const phoneReanalysisV6 = {
  async build(): Promise<number> {
    await buildV6();
    return 6;
  },
};
(globalThis as unknown as { phoneReanalysisV6: typeof phoneReanalysisV6 }).phoneReanalysisV6 = phoneReanalysisV6;

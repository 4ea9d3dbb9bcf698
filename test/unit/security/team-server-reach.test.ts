import { describe, expect, it } from 'vitest';
import { cspDirectives, cspHeaderValue, teamServerOrigin } from '../../../src/lib/security/content-security-policy.js';
import { explainBlockedTeamServer } from '../../../src/lib/security/team-server-reach';

// The policies are made by the same function the build uses (svelte.config.js), so the check reads what the browser enforces.
const builtWith = (origin: string | undefined) => cspHeaderValue(cspDirectives(teamServerOrigin(origin)), ['sha256-AAAA']);
const page = 'https://app.example';

describe('why a team server address is blocked by the page itself', () => {
  it('names the one origin the build allows and how to change it', () => {
    const message = explainBlockedTeamServer('http://10.0.0.7:8788/', builtWith('https://team.example'), page);
    expect(message).toBe(
      'This build of Kinnote may connect only to the team server at https://team.example (set by KINNOTE_TEAM_SERVER_ORIGIN when it was built), so the browser blocks http://10.0.0.7:8788. To use http://10.0.0.7:8788, build Kinnote again with KINNOTE_TEAM_SERVER_ORIGIN=http://10.0.0.7:8788 (README, "Team server").',
    );
  });
  it('says when the build allows no team server at all', () => {
    expect(explainBlockedTeamServer('https://team.example/x', builtWith(undefined), page)).toMatch(/^This build of Kinnote may connect to no team server: it was built without KINNOTE_TEAM_SERVER_ORIGIN/);
  });
  it('stays silent (a real network failure) for the allowed origin, the page\'s own origin, or no policy', () => {
    expect(explainBlockedTeamServer('https://team.example/api/', builtWith('https://team.example'), page)).toBeNull();
    expect(explainBlockedTeamServer('https://app.example/team', builtWith(undefined), page)).toBeNull();
    expect(explainBlockedTeamServer('https://elsewhere.example', null, page)).toBeNull();
    expect(explainBlockedTeamServer('not a url', builtWith(undefined), page)).toBeNull();
  });
});

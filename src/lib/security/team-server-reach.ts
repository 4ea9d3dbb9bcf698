/**
 * Why a team server address cannot be reached when the page's own Content-Security-Policy is the
 * cause: the built page may connect only to the origin set by KINNOTE_TEAM_SERVER_ORIGIN at build
 * time (content-security-policy.js), and the browser's refusal looks like a network failure to the
 * page. Pure: the policy text and the page's origin are passed in (see pagePolicy below).
 */
export function explainBlockedTeamServer(serverUrl: string, policy: string | null, pageOrigin: string): string | null {
  if (policy === null) return null;
  let target: string;
  try {
    target = new URL(serverUrl).origin;
  } catch {
    return null;
  }
  const directive = policy
    .split(';')
    .map((d) => d.trim().split(/\s+/))
    .find((parts) => parts[0]?.toLowerCase() === 'connect-src');
  if (!directive) return null;
  const sources = directive.slice(1);
  const allowed = sources.filter((s) => /^https?:\/\//i.test(s)).map((s) => new URL(s).origin);
  if (allowed.includes(target) || (sources.includes("'self'") && target === pageOrigin)) return null;
  const how = `To use ${target}, build Kinnote again with KINNOTE_TEAM_SERVER_ORIGIN=${target} (README, "Team server").`;
  if (allowed.length === 0) return `This build of Kinnote may connect to no team server: it was built without KINNOTE_TEAM_SERVER_ORIGIN, so the browser blocks ${target}. ${how}`;
  return `This build of Kinnote may connect only to the team server at ${allowed.join(' or ')} (set by KINNOTE_TEAM_SERVER_ORIGIN when it was built), so the browser blocks ${target}. ${how}`;
}

/** The Content-Security-Policy of the current page (its meta tag), or null outside a browser or without one. */
export function pagePolicy(): string | null {
  const meta = globalThis.document?.querySelector('meta[http-equiv="content-security-policy" i]');
  return meta?.getAttribute('content') ?? null;
}

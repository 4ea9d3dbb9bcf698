// Public face of src/lib/security: other folders import only this file.
export { cspDirectives, cspHeaderValue, teamServerOrigin } from './content-security-policy';
export { explainBlockedTeamServer, pagePolicy } from './team-server-reach';

/** The local provider's address, known before anything else starts (no provider code loaded). */
export function localIssuer(env: NodeJS.ProcessEnv = process.env): string {
  return (env.IDP_ISSUER || `http://localhost:${env.IDP_PORT || 3001}`).replace(/\/+$/, '');
}

/**
 * True when Ebbline should sign in through the local provider: OIDC_ISSUER is unset or
 * names the local provider. A company provider in OIDC_ISSUER turns the local one off.
 */
export function usesLocalProvider(env: NodeJS.ProcessEnv = process.env): boolean {
  return !env.OIDC_ISSUER || env.OIDC_ISSUER.replace(/\/+$/, '') === localIssuer(env);
}

/** What the portal learns from its host at start-up: where the API is and which key to use. */
export interface RuntimeConfig {
  /** Base URL of the Tropline API. */
  readonly apiUrl: string;
  /** The portal's browser key, bound to this site's origin. */
  readonly apiKey: string;
}

/**
 * Reads `runtime-config.json` next to the page. Agencies deploy the same build to test and
 * production sites and change only this file (or, as here, let the server write it).
 */
export async function loadRuntimeConfig(): Promise<RuntimeConfig> {
  const res = await fetch(new URL('runtime-config.json', document.baseURI));
  if (!res.ok) throw new Error(`runtime-config.json: HTTP ${res.status}`);
  const body = (await res.json()) as Partial<RuntimeConfig>;
  if (typeof body.apiUrl !== 'string' || typeof body.apiKey !== 'string') {
    throw new Error('runtime-config.json must give apiUrl and apiKey as strings');
  }
  return { apiUrl: body.apiUrl, apiKey: body.apiKey };
}

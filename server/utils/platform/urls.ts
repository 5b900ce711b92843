// The app's public address, for links that leave it: e-mailed links and the QR codes on labels.

/** Configured (NUXT_PUBLIC_BASE_URL), or taken from the request; without a trailing slash. */
export function publicBaseUrl(event?: Parameters<typeof getRequestURL>[0]): string {
  const configured = useRuntimeConfig().public.baseUrl
  if (configured) return configured.replace(/\/$/, '')
  if (event) return getRequestURL(event).origin
  throw new Error('Set NUXT_PUBLIC_BASE_URL so that e-mail and labels can link back to the app.')
}

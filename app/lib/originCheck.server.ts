// Refusing writes that another site's page sends on a signed-in planner's behalf. Browsers say
// where a request comes from (Origin, and Sec-Fetch-Site in current ones); a write whose origin is
// not our own is refused before any action runs. Scripts using an API token send neither header
// and are not affected: a browser cannot attach someone's token to a cross-site request.
const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

export const CROSS_ORIGIN_MESSAGE =
  "This request came from another site's page, so it was refused. Submit the form from Kilostep itself.";

/**
 * The host the client addressed. A reverse proxy in front must pass the Host header on unchanged
 * (X-Forwarded-Host is not believed: anyone can send it).
 */
function requestHost(request: Request): string {
  return (request.headers.get("Host") || new URL(request.url).host).toLowerCase();
}

/** True when the request changes something and a browser tells us it came from elsewhere. */
export function isCrossOriginWrite(request: Request): boolean {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return false;
  const fetchSite = request.headers.get("Sec-Fetch-Site");
  if (fetchSite === "cross-site" || fetchSite === "same-site") return true;
  const origin = request.headers.get("Origin");
  if (origin === null) return false;
  if (origin === "null") return true;
  let originHost: string;
  try {
    originHost = new URL(origin).host.toLowerCase();
  } catch {
    return true;
  }
  return originHost !== requestHost(request);
}

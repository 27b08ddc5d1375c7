// React Router's default Node entry, plus the request's CSP nonce on every inline script it renders.
import { PassThrough } from "node:stream";
import { createReadableStreamFromReadable } from "@react-router/node";
import { isbot } from "isbot";
import { renderToPipeableStream, type RenderToPipeableStreamOptions } from "react-dom/server";
import { ServerRouter, type EntryContext, type RouterContextProvider } from "react-router";
import { CspNonceContext } from "~/utils/csp-nonce";
import { allowFor405, cspNonceContext, newCspNonce, setSecurityHeaders } from "~/utils/security.server";

export const streamTimeout = 5_000;

export default function handleRequest(
  request: Request,
  responseStatusCode: number,
  responseHeaders: Headers,
  routerContext: EntryContext,
  loadContext: RouterContextProvider,
) {
  // The root middleware picks the nonce and sets the headers again on the way out; a URL that matches no route
  // (a 404) never reaches it, so the document sets them itself.
  const nonce = loadContext.get(cspNonceContext) || newCspNonce();
  setSecurityHeaders(responseHeaders, nonce);
  // A method React Router refuses before the root middleware runs (OPTIONS, PROPFIND...) is answered here.
  if (responseStatusCode === 405 && !responseHeaders.has("Allow")) responseHeaders.set("Allow", allowFor405(request));

  // https://httpwg.org/specs/rfc9110.html#HEAD
  if (request.method.toUpperCase() === "HEAD") {
    return new Response(null, { status: responseStatusCode, headers: responseHeaders });
  }

  return new Promise<Response>((resolve, reject) => {
    let shellRendered = false;
    const userAgent = request.headers.get("user-agent");
    // Bots (and SPA mode) get the whole document at once.
    const readyOption: keyof RenderToPipeableStreamOptions =
      (userAgent && isbot(userAgent)) || routerContext.isSpaMode ? "onAllReady" : "onShellReady";

    // Abort after streamTimeout, leaving time to flush the rejected boundaries.
    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(() => abort(), streamTimeout + 1000);

    // ServerRouter hands the nonce to <Scripts>, <ScrollRestoration> and its streamed data; CspNonceContext to our own.
    const app = (
      <CspNonceContext.Provider value={nonce}>
        <ServerRouter context={routerContext} url={request.url} nonce={nonce} />
      </CspNonceContext.Provider>
    );
    const { pipe, abort } = renderToPipeableStream(app, {
      nonce,
      [readyOption]() {
        shellRendered = true;
        const body = new PassThrough({
          final(callback) {
            clearTimeout(timeoutId);
            timeoutId = undefined;
            callback();
          },
        });
        const stream = createReadableStreamFromReadable(body);
        responseHeaders.set("Content-Type", "text/html");
        pipe(body);
        resolve(new Response(stream, { headers: responseHeaders, status: responseStatusCode }));
      },
      onShellError(error: unknown) {
        reject(error);
      },
      onError(error: unknown) {
        responseStatusCode = 500;
        // Errors before the shell are logged by React Router; log only those while streaming.
        if (shellRendered) console.error(error);
      },
    });
  });
}

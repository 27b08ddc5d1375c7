import { createContext, useContext } from "react";

/** The Content-Security-Policy nonce of the document being rendered on the server (entry.server.tsx provides it). */
export const CspNonceContext = createContext<string | undefined>(undefined);

/** The nonce for an inline script of our own; undefined in the browser, which hides nonces from the page anyway. */
export function useCspNonce() {
  return useContext(CspNonceContext);
}

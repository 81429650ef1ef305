import { inflateRawSync } from 'node:zlib';
import { DOMParser } from '@xmldom/xmldom';

const PROTOCOL_NS = 'urn:oasis:names:tc:SAML:2.0:protocol';
const ASSERTION_NS = 'urn:oasis:names:tc:SAML:2.0:assertion';

/** What the provider reads from a service provider's AuthnRequest. */
export interface AuthnRequest {
  readonly id: string;
  readonly issuer: string;
  readonly destination: string | null;
  readonly assertionConsumerUrl: string | null;
}

export class InvalidAuthnRequest extends Error {}

/** Decodes the HTTP-Redirect binding's `SAMLRequest` (SAML 2.0 bindings §3.4.4.1: DEFLATE, then base64). */
export function decodeRedirectRequest(samlRequest: string): AuthnRequest {
  let xml: string;
  try {
    xml = inflateRawSync(Buffer.from(samlRequest, 'base64')).toString('utf8');
  } catch {
    throw new InvalidAuthnRequest('SAMLRequest is not DEFLATE-compressed base64');
  }
  const root = new DOMParser({ errorHandler: () => undefined }).parseFromString(xml, 'text/xml').documentElement;
  if (!root || root.namespaceURI !== PROTOCOL_NS || root.localName !== 'AuthnRequest') {
    throw new InvalidAuthnRequest('SAMLRequest is not a SAML 2.0 AuthnRequest');
  }
  const id = root.getAttribute('ID');
  const issuer = root.getElementsByTagNameNS(ASSERTION_NS, 'Issuer')[0]?.textContent?.trim();
  if (!id || !issuer) throw new InvalidAuthnRequest('The AuthnRequest has no ID or no Issuer');
  return {
    id,
    issuer,
    destination: root.getAttribute('Destination') || null,
    assertionConsumerUrl: root.getAttribute('AssertionConsumerServiceURL') || null,
  };
}

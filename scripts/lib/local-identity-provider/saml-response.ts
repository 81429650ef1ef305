import { randomBytes } from 'node:crypto';
import { SignedXml } from 'xml-crypto';
import type { SigningKeys } from './signing-keys';

const RSA_SHA256 = 'http://www.w3.org/2001/04/xmldsig-more#rsa-sha256';
const SHA256 = 'http://www.w3.org/2001/04/xmlenc#sha256';
const EXCLUSIVE_C14N = 'http://www.w3.org/2001/10/xml-exc-c14n#';
const ENVELOPED = 'http://www.w3.org/2000/09/xmldsig#enveloped-signature';

/** Everything a SAML 2.0 Response (Web Browser SSO profile) states; tests vary one field at a time. */
export interface ResponseContent {
  readonly issuer: string;
  /** The assertion consumer URL: Response Destination and SubjectConfirmationData Recipient. */
  readonly destination: string;
  readonly audience: string;
  /** The AuthnRequest ID being answered; null for an unsolicited response. */
  readonly inResponseTo: string | null;
  readonly subject: string;
  readonly attributes: Readonly<Record<string, readonly string[]>>;
  readonly issuedAt: Date;
  readonly notBefore: Date;
  readonly notOnOrAfter: Date;
}

/** How long an assertion may be used after it is issued (SAML 2.0 profiles §4.1.4.2: short). */
export const ASSERTION_LIFETIME_MS = 5 * 60_000;
/** Backdating NotBefore a little allows for clocks that run slightly apart. */
const NOT_BEFORE_MARGIN_MS = 30_000;

export function validityWindow(now: Date): Pick<ResponseContent, 'issuedAt' | 'notBefore' | 'notOnOrAfter'> {
  return { issuedAt: now, notBefore: new Date(now.getTime() - NOT_BEFORE_MARGIN_MS), notOnOrAfter: new Date(now.getTime() + ASSERTION_LIFETIME_MS) };
}

const xmlEscape = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
const newId = () => `_${randomBytes(20).toString('hex')}`;
const instant = (date: Date) => date.toISOString();

function attributeStatement(attributes: ResponseContent['attributes']): string {
  const items = Object.entries(attributes).map(
    ([name, values]) =>
      `<saml:Attribute Name="${xmlEscape(name)}" NameFormat="urn:oasis:names:tc:SAML:2.0:attrname-format:basic">` +
      values.map((value) => `<saml:AttributeValue>${xmlEscape(value)}</saml:AttributeValue>`).join('') +
      '</saml:Attribute>',
  );
  return `<saml:AttributeStatement>${items.join('')}</saml:AttributeStatement>`;
}

function unsignedResponse(content: ResponseContent): string {
  const inResponseTo = content.inResponseTo === null ? '' : ` InResponseTo="${xmlEscape(content.inResponseTo)}"`;
  const assertionId = newId();
  const issuer = `<saml:Issuer>${xmlEscape(content.issuer)}</saml:Issuer>`;
  return (
    `<samlp:Response xmlns:samlp="urn:oasis:names:tc:SAML:2.0:protocol" xmlns:saml="urn:oasis:names:tc:SAML:2.0:assertion" ` +
    `ID="${newId()}" Version="2.0" IssueInstant="${instant(content.issuedAt)}" Destination="${xmlEscape(content.destination)}"${inResponseTo}>` +
    issuer +
    '<samlp:Status><samlp:StatusCode Value="urn:oasis:names:tc:SAML:2.0:status:Success"/></samlp:Status>' +
    `<saml:Assertion ID="${assertionId}" Version="2.0" IssueInstant="${instant(content.issuedAt)}">` +
    issuer +
    '<saml:Subject>' +
    `<saml:NameID Format="urn:oasis:names:tc:SAML:2.0:nameid-format:persistent">${xmlEscape(content.subject)}</saml:NameID>` +
    '<saml:SubjectConfirmation Method="urn:oasis:names:tc:SAML:2.0:cm:bearer">' +
    `<saml:SubjectConfirmationData NotOnOrAfter="${instant(content.notOnOrAfter)}" Recipient="${xmlEscape(content.destination)}"${inResponseTo}/>` +
    '</saml:SubjectConfirmation>' +
    '</saml:Subject>' +
    `<saml:Conditions NotBefore="${instant(content.notBefore)}" NotOnOrAfter="${instant(content.notOnOrAfter)}">` +
    `<saml:AudienceRestriction><saml:Audience>${xmlEscape(content.audience)}</saml:Audience></saml:AudienceRestriction>` +
    '</saml:Conditions>' +
    `<saml:AuthnStatement AuthnInstant="${instant(content.issuedAt)}" SessionIndex="${assertionId}">` +
    '<saml:AuthnContext><saml:AuthnContextClassRef>urn:oasis:names:tc:SAML:2.0:ac:classes:unspecified</saml:AuthnContextClassRef></saml:AuthnContext>' +
    '</saml:AuthnStatement>' +
    attributeStatement(content.attributes) +
    '</saml:Assertion>' +
    '</samlp:Response>'
  );
}

/** Signs the element the XPath finds (enveloped, exclusive c14n, RSA-SHA256), placing the signature after its Issuer. */
function signElement(xml: string, elementXPath: string, keys: SigningKeys): string {
  const signer = new SignedXml({ privateKey: keys.privateKey, publicCert: keys.certificate, signatureAlgorithm: RSA_SHA256, canonicalizationAlgorithm: EXCLUSIVE_C14N });
  signer.addReference({ xpath: elementXPath, digestAlgorithm: SHA256, transforms: [ENVELOPED, EXCLUSIVE_C14N] });
  signer.computeSignature(xml, { prefix: 'ds', location: { reference: `${elementXPath}/*[local-name(.)='Issuer']`, action: 'after' } });
  return signer.getSignedXml();
}

/** A SAML 2.0 Response whose assertion and whole response are both signed, as XML text. */
export function signedResponseXml(content: ResponseContent, keys: SigningKeys): string {
  const withSignedAssertion = signElement(unsignedResponse(content), "/*[local-name(.)='Response']/*[local-name(.)='Assertion']", keys);
  return signElement(withSignedAssertion, "/*[local-name(.)='Response']", keys);
}

/** The `SAMLResponse` form value of the HTTP-POST binding: the response XML in base64. */
export function encodeForPostBinding(xml: string): string {
  return Buffer.from(xml, 'utf8').toString('base64');
}

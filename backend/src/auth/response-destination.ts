import { DOMParser } from '@xmldom/xmldom';
import { AppError } from '../http/app-error';

const PROTOCOL_NS = 'urn:oasis:names:tc:SAML:2.0:protocol';
const ASSERTION_NS = 'urn:oasis:names:tc:SAML:2.0:assertion';

const refuse = (message: string) => new AppError({ code: 'sign_in_failed', status: 401, message });

/**
 * The checks the SAML library leaves to its caller (SAML 2.0 core §3.2.2, profiles §4.1.4.3): the
 * Response's Destination and every bearer confirmation's Recipient must be our assertion consumer
 * URL. The signature check that follows proves these values are the identity provider's own.
 */
export function assertAddressedTo(samlResponse: unknown, assertionConsumerUrl: string): void {
  if (typeof samlResponse !== 'string' || samlResponse === '') throw refuse('The sign-in response is missing');
  const xml = Buffer.from(samlResponse, 'base64').toString('utf8');
  const root = new DOMParser({ errorHandler: () => undefined }).parseFromString(xml, 'text/xml').documentElement;
  if (!root || root.namespaceURI !== PROTOCOL_NS || root.localName !== 'Response') throw refuse('The sign-in response is not a SAML 2.0 Response');
  if (root.getAttribute('Destination') !== assertionConsumerUrl) throw refuse('The sign-in response was addressed to another service');
  const confirmations = Array.from(root.getElementsByTagNameNS(ASSERTION_NS, 'SubjectConfirmationData'));
  if (confirmations.some((data) => data.getAttribute('Recipient') !== assertionConsumerUrl)) throw refuse('The sign-in assertion was meant for another service');
}

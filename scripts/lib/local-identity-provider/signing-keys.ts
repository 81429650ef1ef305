import fs from 'node:fs';
import path from 'node:path';
import { generate } from 'selfsigned';

export interface SigningKeys {
  readonly privateKey: string;
  readonly certificate: string;
}

const KEY_FILE = 'idp-signing-key.pem';
const CERT_FILE = 'idp-signing-cert.pem';
const VALID_YEARS = 10;

export const certificateFile = (folder: string) => path.join(folder, CERT_FILE);

/** A new RSA key pair with a self-signed certificate (SHA-256, since selfsigned defaults to SHA-1). */
export async function createSigningKeys(commonName: string): Promise<SigningKeys> {
  const notAfterDate = new Date();
  notAfterDate.setFullYear(notAfterDate.getFullYear() + VALID_YEARS);
  const pems = await generate([{ name: 'commonName', value: commonName }], { keySize: 2048, algorithm: 'sha256', notAfterDate });
  return { privateKey: pems.private, certificate: pems.cert };
}

/** The provider's key pair from `folder`, made on first use and kept, so the server's trust lasts between runs. */
export async function loadOrCreateSigningKeys(folder: string): Promise<SigningKeys> {
  const keyPath = path.join(folder, KEY_FILE);
  if (fs.existsSync(keyPath) && fs.existsSync(certificateFile(folder))) {
    return { privateKey: fs.readFileSync(keyPath, 'utf8'), certificate: fs.readFileSync(certificateFile(folder), 'utf8') };
  }
  const keys = await createSigningKeys('Spanledger local identity provider');
  fs.mkdirSync(folder, { recursive: true });
  fs.writeFileSync(keyPath, keys.privateKey, { mode: 0o600 });
  fs.writeFileSync(certificateFile(folder), keys.certificate);
  return keys;
}

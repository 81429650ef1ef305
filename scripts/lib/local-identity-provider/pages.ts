import { ROLE_NAMES, ROLES } from '../../../shared/src';
import { DEMO_AUTHORITY, type DemoUser } from './demo-users';

const htmlEscape = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');

const STYLE = `
  body { font: 16px/1.5 system-ui, sans-serif; margin: 0; background: #eef1f4; color: #1d2530; }
  header { background: #27445c; color: #fff; padding: 16px 32px; }
  header h1 { margin: 0; font-size: 20px; font-weight: 600; }
  header p { margin: 4px 0 0; opacity: 0.85; font-size: 14px; }
  main { max-width: 880px; margin: 24px auto; padding: 0 24px; }
  .note { background: #fff8e1; border-left: 4px solid #c58b00; padding: 8px 16px; margin-bottom: 24px; }
  h2 { font-size: 17px; margin: 24px 0 8px; }
  ul { list-style: none; margin: 0; padding: 0; display: grid; grid-template-columns: repeat(auto-fill, minmax(260px, 1fr)); gap: 12px; }
  li form { background: #fff; border-radius: 8px; padding: 12px 16px; box-shadow: 0 1px 3px rgba(0,0,0,.15); margin: 0; }
  .name { font-weight: 600; }
  .detail { font-size: 14px; color: #4a5563; }
  button { margin-top: 8px; font: inherit; padding: 6px 14px; border-radius: 6px; border: 1px solid #27445c; background: #27445c; color: #fff; cursor: pointer; }
  button:focus-visible { outline: 3px solid #c58b00; outline-offset: 2px; }
`;

function page(title: string, body: string, scriptNonce?: string, script?: string): string {
  const scriptTag = script && scriptNonce ? `<script nonce="${scriptNonce}">${script}</script>` : '';
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${htmlEscape(title)}</title><style>${STYLE}</style></head><body>${body}${scriptTag}</body></html>`;
}

function districtsText(user: DemoUser): string {
  if (user.districts.length > 0) return user.districts.join(', ');
  return user.role === 'manager' ? 'Whole network' : 'No district';
}

/** The sign-in page: the demo staff grouped by role, each with a button that signs them in. */
export function signInPage(users: readonly DemoUser[], samlRequest: string, relayState: string | null): string {
  const hidden = `<input type="hidden" name="SAMLRequest" value="${htmlEscape(samlRequest)}">` + (relayState === null ? '' : `<input type="hidden" name="RelayState" value="${htmlEscape(relayState)}">`);
  const groups = ROLES.map((role) => {
    const cards = users
      .filter((user) => user.role === role)
      .map(
        (user) =>
          `<li><form method="post" action="sso">${hidden}<input type="hidden" name="subject" value="${htmlEscape(user.subject)}">` +
          `<div class="name">${htmlEscape(user.displayName)}</div>` +
          `<div class="detail">${htmlEscape(ROLE_NAMES[user.role])}${user.admin ? ' · administrator' : ''}</div>` +
          `<div class="detail">${htmlEscape(districtsText(user))}</div>` +
          `<button type="submit" data-subject="${htmlEscape(user.subject)}">Sign in as ${htmlEscape(user.displayName)}</button></form></li>`,
      )
      .join('');
    return `<h2>${htmlEscape(ROLE_NAMES[role])}s</h2><ul>${cards}</ul>`;
  }).join('');
  return page(
    `Sign in · ${DEMO_AUTHORITY}`,
    `<header><h1>${htmlEscape(DEMO_AUTHORITY)}</h1><p>Staff sign-in</p></header><main>` +
      '<p class="note">This is the local identity provider for development, demonstrations and tests. It stands in for your organisation\'s own sign-in and asks for no password: choose who you want to be.</p>' +
      `${groups}</main>`,
  );
}

/** The HTTP-POST binding (SAML 2.0 bindings §3.5): a form that submits itself to the assertion consumer. */
export function autoSubmitPage(assertionConsumerUrl: string, samlResponse: string, relayState: string | null, scriptNonce: string): string {
  const relay = relayState === null ? '' : `<input type="hidden" name="RelayState" value="${htmlEscape(relayState)}">`;
  return page(
    'Signing in…',
    `<main><form method="post" action="${htmlEscape(assertionConsumerUrl)}"><input type="hidden" name="SAMLResponse" value="${htmlEscape(samlResponse)}">${relay}` +
      '<p>Signing you in to Spanledger…</p><noscript><button type="submit">Continue</button></noscript></form></main>',
    scriptNonce,
    'document.forms[0].submit();',
  );
}

export function messagePage(title: string, message: string): string {
  return page(title, `<header><h1>${htmlEscape(title)}</h1></header><main><p>${htmlEscape(message)}</p></main>`);
}

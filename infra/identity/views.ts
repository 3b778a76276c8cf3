/**
 * The local provider's pages, in Ebbline's look. Server-rendered HTML with one stylesheet and
 * no inline script, so a strict content security policy holds.
 */

/** Escapes text for HTML element content and attribute values. */
export function escapeHtml(value: unknown): string {
  return String(value ?? '').replace(/[&<>"'`]/g, (c) => `&#${c.charCodeAt(0)};`);
}

const LOGO = `<svg viewBox="0 0 32 32" aria-hidden="true"><rect width="32" height="32" rx="7" fill="#17434d"/><path d="M5 7 C 9 18, 15 24, 27 25" fill="none" stroke="#f2b544" stroke-width="3" stroke-linecap="round"/><path d="M5 27 H27" stroke="#5fb3b3" stroke-width="2" stroke-linecap="round"/></svg>`;

const ALERT_ICON = `<svg class="icon" viewBox="0 0 20 20" aria-hidden="true"><circle cx="10" cy="10" r="9" fill="none" stroke="currentColor" stroke-width="2"/><path d="M10 5.5v5.5" stroke="currentColor" stroke-width="2" stroke-linecap="round"/><circle cx="10" cy="14.5" r="1.2" fill="currentColor"/></svg>`;

export interface PageOptions {
  title: string;
  body: string;
  /** Scripts from /assets (no inline script). */
  scripts?: string[];
}

/** The frame of every page: the brand, a card, the footer. */
export function page({ title, body, scripts = [] }: PageOptions): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="theme-color" content="#0f2a33">
<meta name="robots" content="noindex">
<title>${escapeHtml(title)} · Brackenmoor sign-in</title>
<link rel="icon" type="image/svg+xml" href="/assets/favicon.svg">
<link rel="stylesheet" href="/assets/sign-in.css">
</head>
<body>
<div class="brand">${LOGO}<span class="brand-name">Ebbline<span class="brand-tag">Brackenmoor staff sign-in</span></span></div>
<main class="card">
${body}
</main>
<p class="footer">The local sign-in service of Ebbline's demo and tests. In a plant, Ebbline signs in through the company's own provider.</p>
${scripts.map((src) => `<script src="${escapeHtml(src)}" defer></script>`).join('\n')}
</body>
</html>`;
}

function alert(title: string, text?: string): string {
  return `<div class="alert" role="alert" data-testid="sign-in-error">${ALERT_ICON}<div><strong>${escapeHtml(title)}</strong>${
    text ? escapeHtml(text) : ''
  }</div></div>`;
}

export interface SignInPageOptions {
  uid: string;
  clientName: string;
  login?: string;
  /** Shown above the form: why the last attempt failed. */
  error?: { title: string; text?: string };
}

/** The sign-in form: login and password. */
export function signInPage({ uid, clientName, login = '', error }: SignInPageOptions): string {
  const invalid = error ? ' aria-invalid="true" aria-describedby="sign-in-problem"' : '';
  return page({
    title: 'Sign in',
    body: `<h1>Sign in</h1>
<p class="lead">to ${escapeHtml(clientName)}, with your Brackenmoor staff account.</p>
${error ? `<div id="sign-in-problem">${alert(error.title, error.text)}</div>` : ''}
<form method="post" action="/interaction/${escapeHtml(uid)}/login" autocomplete="on" novalidate>
  <div class="field">
    <label for="login">Login</label>
    <input id="login" name="login" type="text" autocomplete="username" autocapitalize="none" spellcheck="false" required value="${escapeHtml(login)}"${login ? '' : ' autofocus'}${invalid}>
  </div>
  <div class="field">
    <label for="password">Password</label>
    <input id="password" name="password" type="password" autocomplete="current-password" required${login ? ' autofocus' : ''}${invalid}>
  </div>
  <button class="button" type="submit">Sign in</button>
</form>
<p class="help">Demo accounts (such as <code>maren</code>, the admin) are listed in the README's table, with their passwords.</p>`,
  });
}

export interface ConsentPageOptions {
  uid: string;
  clientName: string;
  accountName: string;
  /** Plain-language lines of what the app will learn. */
  shares: string[];
}

/** Asks a person to let an app that is not Ebbline itself learn about them. */
export function consentPage({ uid, clientName, accountName, shares }: ConsentPageOptions): string {
  return page({
    title: 'Allow access',
    body: `<h1>Allow ${escapeHtml(clientName)}?</h1>
<p class="lead">Signed in as ${escapeHtml(accountName)}. ${escapeHtml(clientName)} asks to learn:</p>
<ul class="scopes">${shares.map((s) => `<li>${escapeHtml(s)}</li>`).join('')}</ul>
<form method="post" action="/interaction/${escapeHtml(uid)}/confirm"><button class="button" type="submit">Allow</button></form>
<form method="post" action="/interaction/${escapeHtml(uid)}/abort"><button class="button secondary" type="submit">Do not allow</button></form>`,
  });
}

/**
 * The provider's sign-out confirmation. `form` is the provider's own hidden form (with its
 * anti-forgery field); a small script confirms at once, since the person has just chosen
 * "Sign out" in Ebbline. Without JavaScript the buttons do it.
 */
export function signOutPage(form: string): string {
  const autoForm = form.replace('<form ', '<form data-auto-submit ');
  return page({
    title: 'Signing out',
    body: `<h1>Signing you out…</h1>
<p class="lead">Ending your Brackenmoor sign-in as well, so the next person at this device has to sign in.</p>
${autoForm}
<button class="button" type="submit" form="op.logoutForm" name="logout" value="yes" autofocus>Sign out</button>
<button class="button secondary" type="submit" form="op.logoutForm">Stay signed in here</button>`,
    scripts: ['/assets/auto-submit.js'],
  });
}

/** Shown after signing out when no app asked to be returned to. */
export function signedOutPage(appUrl: string | null): string {
  return page({
    title: 'Signed out',
    body: `<h1>You have signed out</h1>
<p class="lead">Your Brackenmoor sign-in has ended on this device.</p>
${appUrl ? `<a class="button" href="${escapeHtml(appUrl)}">Back to Ebbline</a>` : ''}`,
  });
}

/** Something went wrong: said plainly, with a way back. */
export function problemPage(title: string, text: string, appUrl: string | null): string {
  return page({
    title,
    body: `<h1>${escapeHtml(title)}</h1>
<p class="lead">${escapeHtml(text)}</p>
${appUrl ? `<a class="button" href="${escapeHtml(appUrl)}">Start again from Ebbline</a>` : ''}`,
  });
}

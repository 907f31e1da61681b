/**
 * The department's mail look: a plain-text part that reads well on its own and a simple HTML part with
 * inline styles (mail clients ignore style sheets). Every template returns both.
 */

export interface RenderedMail { subject: string, text: string, html: string }

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)

export function mailLayout(heading: string, paragraphs: string[], action?: { label: string, url: string }): string {
  const body = paragraphs.map(p => `<p style="margin:0 0 14px;font-size:15px;line-height:22px;color:#17212b">${escapeHtml(p)}</p>`).join('')
  const button = action
    ? `<p style="margin:22px 0"><a href="${escapeHtml(action.url)}" style="background:#9a3f1c;color:#ffffff;padding:10px 18px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p>
       <p style="margin:0 0 14px;font-size:13px;color:#44535f">Or paste this address into your browser: ${escapeHtml(action.url)}</p>`
    : ''
  return `<!doctype html><html><body style="margin:0;background:#faf8f3;font-family:'Source Sans 3',Arial,sans-serif">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0"><tr><td align="center" style="padding:24px">
<table role="presentation" width="560" cellpadding="0" cellspacing="0" style="background:#ffffff;border:1px solid #e4ddcc;border-radius:8px">
<tr><td style="background:#17212b;color:#ffffff;padding:14px 22px;font-size:18px;font-weight:700;border-radius:8px 8px 0 0">Perpend · Corrstone technical department</td></tr>
<tr><td style="padding:22px"><h1 style="margin:0 0 16px;font-size:20px;color:#17212b">${escapeHtml(heading)}</h1>${body}${button}</td></tr>
<tr><td style="padding:14px 22px;border-top:1px solid #e4ddcc;font-size:12px;color:#44535f">Corrstone Building Systems Ltd is an invented demonstration company.</td></tr>
</table></td></tr></table></body></html>`
}

function textLayout(heading: string, paragraphs: string[], action?: { label: string, url: string }): string {
  return [heading, '', ...paragraphs.flatMap(p => [p, '']), ...(action ? [`${action.label}: ${action.url}`, ''] : []),
    '-- ', 'Perpend, Corrstone technical department (invented demonstration company)'].join('\n')
}

function compose(subject: string, heading: string, paragraphs: string[], action?: { label: string, url: string }): RenderedMail {
  return { subject, text: textLayout(heading, paragraphs, action), html: mailLayout(heading, paragraphs, action) }
}

export const accountMails = {
  verifyEmail: (name: string, url: string) => compose(
    'Confirm your e-mail address for Perpend',
    `Welcome, ${name}`,
    ['Confirm your e-mail address to finish setting up your account. The link works once and expires in 48 hours.',
      'If you did not register, ignore this message and nothing will happen.'],
    { label: 'Confirm my address', url },
  ),
  alreadyRegistered: (name: string, url: string) => compose(
    'You already have a Perpend account',
    `Hello ${name}`,
    ['Someone (perhaps you) tried to register with this address, which already has an account. If you have forgotten the password, you can set a new one.'],
    { label: 'Set a new password', url },
  ),
  resetPassword: (name: string, url: string) => compose(
    'Set a new Perpend password',
    `Hello ${name}`,
    ['Use the link below to choose a new password. It works once and expires in one hour.',
      'If you did not ask for this, ignore this message: your password stays as it is.'],
    { label: 'Choose a new password', url },
  ),
  invitation: (name: string, role: string, url: string) => compose(
    'Your Perpend account is ready',
    `Hello ${name}`,
    [`An administrator has created a Perpend account for you with the role "${role}". Choose a password to start. The link works once and expires in 7 days.`],
    { label: 'Choose my password', url },
  ),
}

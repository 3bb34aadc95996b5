/** Reads the local mail catcher the test runner starts (MAIL_API_URL). */
export interface CaughtMail {
  id: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  links: string[];
  attachments: Array<{ index: number; filename: string; contentType: string; size: number }>;
}

function mailApi(): string {
  const url = process.env.MAIL_API_URL;
  if (!url) throw new Error('MAIL_API_URL is not set: run the tests through `npm test`, which starts the mail catcher.');
  return url.replace(/\/$/, '');
}

export async function waitForMail(to: string, subjectIncludes: string, timeoutMs = 10000): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const list = (await (await fetch(`${mailApi()}/api/messages?to=${encodeURIComponent(to)}`)).json()) as Array<{ id: string; subject: string }>;
    const hit = list.find((m) => m.subject.includes(subjectIncludes));
    if (hit) return (await (await fetch(`${mailApi()}/api/messages/${hit.id}`)).json()) as CaughtMail;
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`No mail to ${to} with "${subjectIncludes}" within ${timeoutMs} ms`);
}

export function tokenFromLink(mail: CaughtMail, pathPart: string): string {
  const link = mail.links.find((l) => l.includes(pathPart));
  if (!link) throw new Error(`No ${pathPart} link in "${mail.subject}"`);
  const token = new URL(link).searchParams.get('token');
  if (!token) throw new Error(`The ${pathPart} link has no token`);
  return token;
}

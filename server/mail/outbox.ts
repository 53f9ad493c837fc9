import { promises as fs } from 'node:fs';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';

export interface CapturedMail {
  id: string;
  from: string;
  to: string[];
  subject: string;
  date: string;
  text: string;
  html: string | null;
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  if (!field) return [];
  const list = Array.isArray(field) ? field : [field];
  return list.flatMap((a) => a.value.map((v) => v.address ?? v.name)).filter(Boolean);
}

/** Reads the .eml files the SMTP fake wrote, newest first (development and tests only). */
export async function readOutbox(dir: string, limit = 100): Promise<CapturedMail[]> {
  let names: string[];
  try {
    names = (await fs.readdir(dir)).filter((n) => n.endsWith('.eml'));
  } catch {
    return [];
  }
  names.sort().reverse();
  return Promise.all(
    names.slice(0, limit).map(async (name) => {
      const parsed = await simpleParser(await fs.readFile(path.join(dir, name)));
      return {
        id: name.replace(/\.eml$/, ''),
        from: parsed.from?.text ?? '',
        to: addresses(parsed.to),
        subject: parsed.subject ?? '',
        date: (parsed.date ?? new Date(0)).toISOString(),
        text: parsed.text ?? '',
        html: typeof parsed.html === 'string' ? parsed.html : null,
      };
    }),
  );
}

// Text the database can store. A lone UTF-16 surrogate (half of a pair, "\ud800" in JSON) fails MariaDB's check of
// a JSON column (a 500) and is silently stored as U+FFFD in a text column; bytes that are not UTF-8 in a URL or body
// become U+FFFD too. All of it is refused here, once for every route, with a 400 that names the field.
import { isUtf8 } from 'node:buffer';
import type { IncomingMessage } from 'node:http';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { badRequest } from '../lib/http-error';

// With the u flag a proper pair is one code point, so only an unpaired half matches.
const LONE_SURROGATE = /\p{Cs}/u;
const FIELD_MESSAGE = 'Contains a broken character';

const refused = (fields: Record<string, string>) =>
  badRequest(
    'Some text in the request is not valid Unicode (a broken character, such as half of an emoji). Retype it and try again.',
    fields,
  );

const hasLoneSurrogate = (s: string) => LONE_SURROGATE.test(s);

/** A URL part decoded, or null when its percent-escapes do not spell UTF-8; a stray "%" (as in "50%") stays. */
function decodeUrlPart(part: string): string | null {
  try {
    return decodeURIComponent(part.replace(/\+/g, ' ').replace(/%(?![0-9a-fA-F]{2})/g, '%25'));
  } catch {
    return null;
  }
}

type Node = { value: unknown; key: string; parent: Node | null };

const pathOf = (node: Node | null): string => {
  const keys: string[] = [];
  for (let n = node; n?.parent; n = n.parent) keys.push(n.key);
  return keys.reverse().join('.') || '_';
};

/** The path (dot-joined, as zod names fields) of the first string or key with a lone surrogate, or null. */
export function findMalformedText(value: unknown): string | null {
  // A stack instead of recursion, and parent links instead of copied paths: a JSON body nested a hundred thousand
  // deep must neither overflow the call stack nor cost quadratic time.
  const stack: Node[] = [{ value, key: '', parent: null }];
  while (stack.length > 0) {
    const node = stack.pop()!;
    const v = node.value;
    if (typeof v === 'string') {
      if (hasLoneSurrogate(v)) return pathOf(node);
    } else if (Array.isArray(v)) {
      for (let i = 0; i < v.length; i++) stack.push({ value: v[i], key: String(i), parent: node });
    } else if (v !== null && typeof v === 'object') {
      for (const [key, item] of Object.entries(v)) {
        if (hasLoneSurrogate(key)) return pathOf({ value: item, key: key.replace(/\p{Cs}/gu, '\ufffd'), parent: node });
        stack.push({ value: item, key, parent: node });
      }
    }
  }
  return null;
}

/** express.json's `verify`: the raw body must be UTF-8 when it says it is (body-parser would put U+FFFD in). */
export function verifyUtf8Body(_req: IncomingMessage, _res: unknown, body: Buffer, encoding: string) {
  if (/^utf-?8$/i.test(encoding) && !isUtf8(body)) throw refused({ _: 'The body is not UTF-8 text' });
}

/** Mounted after the JSON parser; multipart fields are decoded as UTF-8 by multer and cannot hold a lone half. */
export function wellFormedText(): RequestHandler {
  return (req: Request, _res: Response, next: NextFunction) => {
    const url = req.originalUrl;
    const q = url.indexOf('?');
    // Percent-escapes must spell UTF-8: %ED%A0%80 (an encoded surrogate) or %FF would otherwise decode to U+FFFD.
    const rawPath = q < 0 ? url : url.slice(0, q);
    if (decodeUrlPart(rawPath) === null) return next(refused({ _: 'The address is not valid UTF-8' }));
    if (q >= 0) {
      for (const pair of url.slice(q + 1).split('&')) {
        if (decodeUrlPart(pair) !== null) continue;
        return next(refused({ [decodeUrlPart(pair.split('=')[0]) || '_']: FIELD_MESSAGE }));
      }
    }
    const inQuery = findMalformedText(req.query);
    if (inQuery) return next(refused({ [inQuery]: FIELD_MESSAGE }));
    const inParams = findMalformedText(req.params);
    if (inParams) return next(refused({ [inParams]: FIELD_MESSAGE }));
    const inBody = findMalformedText(req.body);
    if (inBody) return next(refused({ [inBody]: FIELD_MESSAGE }));
    next();
  };
}

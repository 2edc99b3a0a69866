import { randomBytes } from 'node:crypto';

/** 96 random bits, URL-safe: for user ids and the like. */
export const newId = () => randomBytes(12).toString('base64url');
/** 256 random bits, URL-safe: for tokens that grant something (QR labels, links). */
export const newToken = () => randomBytes(32).toString('base64url');

/** Coded errors of the request guards (server/security). */
import { GridshakeError } from '../errors.js';

/** A Host header that is not the bound address or localhost: a DNS-rebinding attempt or a misdirected request. */
export function hostError(message: string): GridshakeError {
  return new GridshakeError('GS_ERR_HOST', message);
}

/** An Origin header from another site (cross-site request). */
export function originError(message: string): GridshakeError {
  return new GridshakeError('GS_ERR_ORIGIN', message);
}

/** A state-changing request whose body is neither JSON nor multipart/form-data. */
export function contentTypeError(message: string): GridshakeError {
  return new GridshakeError('GS_ERR_CONTENT_TYPE', message);
}

export { createHostPolicy, isAllowedHost, isAllowedOrigin, parseHostHeader, type HostPolicy } from './allowed-hosts.js';
export { checkRequest, installRequestGuards } from './request-guards.js';
export { contentTypeError, hostError, originError } from './security-errors.js';

/** Importing this registers every model and association with the pool. */
export { User } from './user';
export { ApiToken } from './api-token';
export { AccessEvent } from './access-event';

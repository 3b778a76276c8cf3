/** Importing this registers every model and association with the pool. */
export { User } from './user';
export { ApiToken } from './api-token';
export { AccessEvent } from './access-event';
export { Site } from './site';
export { Area } from './area';
export { Cabinet } from './cabinet';
export { BankDesign } from './bank-design';
export { BankDesignVersion } from './bank-design-version';
export { Bank } from './bank';
export { Spare } from './spare';
export { AuditEntry } from './audit-entry';
export { OutboxMessage } from './outbox-message';
export { ShutdownWindow } from './shutdown-window';
export { Visit } from './visit';
export { VisitBank } from './visit-bank';
export { VisitTechnician } from './visit-technician';
export { PersonSite } from './person-site';

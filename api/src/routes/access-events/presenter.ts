import type { AccessEventKind, AccessEventView } from '../../../../shared/schemas/access-event';
import type { AccessEventWithPeople } from '../../services/access-events';

export function presentAccessEvent(event: AccessEventWithPeople): AccessEventView {
  return {
    id: event.id,
    kind: event.kind as AccessEventKind,
    at: event.createdAt.toISOString(),
    person: event.user ? { id: event.user.id, name: event.user.name } : null,
    actor: event.actor ? { id: event.actor.id, name: event.actor.name } : null,
    login: event.login,
    ip: event.ip,
    userAgent: event.userAgent,
    detail: event.detail,
  };
}

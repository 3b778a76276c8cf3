import { createContext, useContext, type ReactNode } from 'react';
import {
  BANK_DESIGN_EDITORS,
  BASELINE_EDITORS,
  REGISTER_EDITORS,
} from '../../../../../shared/constants/register';
import { hasAnyRole, type Role } from '../../../../../shared/constants/roles';

/** What the signed-in person may change in the register (the server enforces the same rules). */
export interface RegisterPermissions {
  /** Sites, areas, cabinets, banks, spares, import. */
  editRegister: boolean;
  editDesigns: boolean;
  editBaselines: boolean;
  /** The session's CSRF token, for uploads that bypass the API client. */
  csrfToken: string | null;
}

const Context = createContext<RegisterPermissions>({ editRegister: false, editDesigns: false, editBaselines: false, csrfToken: null });

export function permissionsFor(roles: readonly Role[], csrfToken: string | null): RegisterPermissions {
  return {
    editRegister: hasAnyRole(roles, REGISTER_EDITORS),
    editDesigns: hasAnyRole(roles, BANK_DESIGN_EDITORS),
    editBaselines: hasAnyRole(roles, BASELINE_EDITORS),
    csrfToken,
  };
}

export function RegisterPermissionsProvider({ value, children }: { value: RegisterPermissions; children: ReactNode }) {
  return <Context.Provider value={value}>{children}</Context.Provider>;
}

export const useRegisterPermissions = () => useContext(Context);

/** Says plainly that the screen is read-only for this role, where a form would be. */
export function ReadOnlyNote({ children }: { children: ReactNode }) {
  return (
    <p className="rounded-lg bg-tide-100/70 px-3 py-2 text-sm text-tide-800" data-testid="read-only-note">
      {children}
    </p>
  );
}

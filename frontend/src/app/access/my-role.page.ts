import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { PERMISSIONS, ROLE_NAMES, ROLES, can, changeScope, type Permission, type Role } from '@spanledger/shared';

import { SessionStore } from '../session/session.store';

interface MatrixRow {
  readonly permission: Permission;
  readonly allowedFor: ReadonlyArray<{ readonly role: Role; readonly allowed: boolean }>;
  readonly youMay: boolean;
}

/** The permission matrix, with the signed-in user's column marked and where they may change things. */
@Component({
  selector: 'sl-my-role-page',
  imports: [MatIconModule],
  templateUrl: './my-role.page.html',
  styleUrl: './my-role.page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MyRolePage {
  private readonly session = inject(SessionStore);
  protected readonly roles = ROLES;
  protected readonly roleNames = ROLE_NAMES;
  protected readonly user = this.session.user;

  protected readonly rows = computed<MatrixRow[]>(() => {
    const user = this.user();
    return PERMISSIONS.map((permission) => ({
      permission,
      allowedFor: ROLES.map((role) => ({ role, allowed: permission.roles.includes(role) })),
      youMay: !!user && can(user, permission.action),
    }));
  });

  protected readonly scopeText = computed(() => {
    const user = this.user();
    if (!user) return '';
    const scope = changeScope(user);
    if (scope.kind === 'network') return 'You may change things anywhere on the network.';
    if (scope.kind === 'districts') return `You may change things only in ${scope.districts.join(', ')}; you may see the whole network.`;
    return 'You have no district, so you may see the whole network but change nothing in it.';
  });
}

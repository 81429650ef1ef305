import { HttpClient } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { can, type Action, type SignedInUser } from '@spanledger/shared';
import { firstValueFrom } from 'rxjs';

/** Who is signed in, from `GET /api/session`: undefined until asked, null for a visitor. */
@Injectable({ providedIn: 'root' })
export class SessionStore {
  private readonly http = inject(HttpClient);
  private readonly current = signal<SignedInUser | null | undefined>(undefined);
  private loading: Promise<SignedInUser | null> | null = null;

  readonly user = this.current.asReadonly();
  readonly signedIn = computed(() => !!this.current());

  /** Asks the server once; a failed answer is asked again next time. */
  load(): Promise<SignedInUser | null> {
    this.loading ??= firstValueFrom(this.http.get<{ user: SignedInUser | null }>('api/session')).then(
      ({ user }) => this.settle(user),
      (error: unknown) => {
        this.loading = null;
        throw error;
      },
    );
    return this.loading;
  }

  can(action: Action): boolean {
    const user = this.current();
    return !!user && can(user, action);
  }

  /**
   * Ends the session on the server. The app shows itself signed out first, so what polls for the
   * signed-in user (alerts) stops and its requests are cancelled rather than refused; if the
   * server cannot be told, the user is still signed in and is shown so.
   */
  async signOut(): Promise<void> {
    const user = this.current();
    this.settle(null);
    try {
      await firstValueFrom(this.http.post('auth/logout', null));
    } catch (error) {
      this.settle(user ?? null);
      throw error;
    }
  }

  private settle(user: SignedInUser | null): SignedInUser | null {
    this.current.set(user);
    return user;
  }
}

/** The server's sign-in address, coming back to `returnTo` (a path of this app) afterwards. */
export function signInUrl(returnTo: string): string {
  return `auth/saml/login?returnTo=${encodeURIComponent(returnTo)}`;
}

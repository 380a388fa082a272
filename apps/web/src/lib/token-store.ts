/**
 * The signed-in user's bearer token, kept in localStorage so a reload keeps the session.
 * Components follow it with `useAccessToken`; other tabs see sign-in and sign-out through the storage event.
 */
import { useSyncExternalStore } from 'react';

export const TOKEN_STORAGE_KEY = 'kerfwright.accessToken';

type Listener = () => void;
const listeners = new Set<Listener>();

function read(): string | null {
  try {
    return window.localStorage.getItem(TOKEN_STORAGE_KEY);
  } catch {
    return null; // storage blocked (private mode, policy): behave as signed out
  }
}

function notify(): void {
  for (const listener of [...listeners]) listener();
}

export function getAccessToken(): string | null {
  return read();
}

export function setAccessToken(token: string): void {
  try {
    window.localStorage.setItem(TOKEN_STORAGE_KEY, token);
  } finally {
    notify();
  }
}

export function clearAccessToken(): void {
  try {
    window.localStorage.removeItem(TOKEN_STORAGE_KEY);
  } finally {
    notify();
  }
}

const ENDED_KEY = 'kerfwright.sessionEnded';

/**
 * The API refused the token of a session in use (it expired, or the account was changed or deactivated): the
 * session ends here too, and the sign-in page says why the member is there (sessionEndedNotice) once. Only
 * when the refused token is still the one kept.
 */
export function endRefusedSession(refused: string): void {
  // An answer to a request of an earlier session (signed out, or signed in again since) ends nothing.
  if (read() !== refused) return;
  try {
    window.sessionStorage.setItem(ENDED_KEY, '1');
  } catch {
    // storage blocked: signed out all the same, without the sentence
  }
  clearAccessToken();
}

/** Whether the last session ended by the API's refusal (not by signing out); forgetSessionEnded clears it. */
export function sessionEndedNotice(): boolean {
  try {
    return window.sessionStorage.getItem(ENDED_KEY) === '1';
  } catch {
    return false;
  }
}

export function forgetSessionEnded(): void {
  try {
    window.sessionStorage.removeItem(ENDED_KEY);
  } catch {
    // nothing kept
  }
}

export function subscribeAccessToken(listener: Listener): () => void {
  listeners.add(listener);
  const onStorage = (event: StorageEvent) => {
    if (event.key === TOKEN_STORAGE_KEY || event.key === null) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

export function useAccessToken(): string | null {
  return useSyncExternalStore(subscribeAccessToken, read, () => null);
}

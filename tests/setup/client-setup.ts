/**
 * Setup for the client project (happy-dom). @testing-library/jest-dom is not installed: tests
 * use plain assertions. Each test gets a clean DOM and its own fetch stub.
 */
import { cleanup } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// A same-origin page URL, as in the browser (the auth client takes window.location.origin).
const happy = (window as unknown as { happyDOM?: { setURL(url: string): void } }).happyDOM;
happy?.setURL('http://localhost:3000/');

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

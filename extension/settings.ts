/** The extension's settings (`orbitNotes.*`), read in one place with their defaults. */
import * as vscode from 'vscode';
import { DEFAULT_LIMITS, type Limits } from '../compute/limits.js';

/** The settings that shape evaluation and display, with units in their names. */
export interface Settings {
  /** Show results at the end of statement lines. */
  readonly inlineEnabled: boolean;
  /** Quiet time after the last edit before a note is evaluated again, in milliseconds. */
  readonly debounceMs: number;
  readonly limits: Limits;
}

const DAYS_PER_JULIAN_YEAR = 365.25;

/** Settings for a note (resource scope, so a folder may override them). */
export function readSettings(scope?: vscode.Uri): Settings {
  const c = vscode.workspace.getConfiguration('orbitNotes', scope);
  const positive = (key: string, fallback: number): number => {
    const v = c.get<number>(key);
    return typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : fallback;
  };
  return {
    inlineEnabled: c.get<boolean>('inline.enabled', true),
    debounceMs: Math.max(0, c.get<number>('evaluation.debounceMs', 300)),
    limits: {
      maxSpanDays: positive('limits.maxSpanYears', DEFAULT_LIMITS.maxSpanDays / DAYS_PER_JULIAN_YEAR) * DAYS_PER_JULIAN_YEAR,
      maxEvaluations: Math.floor(positive('limits.maxEvaluations', DEFAULT_LIMITS.maxEvaluations)),
      maxTrials: Math.floor(positive('limits.maxTrials', DEFAULT_LIMITS.maxTrials)),
      maxEvents: DEFAULT_LIMITS.maxEvents,
    },
  };
}

/**
 * Every command of the extension, under one prefix. Kept free of the editor API so a unit
 * test can check it against the manifest (package.json `contributes.commands`).
 */
export const Commands = {
  writeResults: 'orbitNotes.writeResults',
  writeWorkspaceResults: 'orbitNotes.writeWorkspaceResults',
  writeBlockResults: 'orbitNotes.writeBlockResults',
  checkNote: 'orbitNotes.checkNote',
  cancelSearches: 'orbitNotes.cancelSearches',
  showOutput: 'orbitNotes.showOutput',
} as const;

/** Any command identifier of the extension. */
export type CommandId = (typeof Commands)[keyof typeof Commands];

/** Commands that take arguments (from a code lens) and so stay out of the Command Palette. */
export const LENS_ONLY_COMMANDS: readonly CommandId[] = [Commands.writeBlockResults];

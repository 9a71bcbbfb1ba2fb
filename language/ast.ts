/**
 * Syntax tree of `orbit` blocks. Positions are in note (document) coordinates:
 * zero-based line and UTF-16 character, like the editor's.
 */

export interface Position { readonly line: number; readonly character: number }
export interface Range { readonly start: Position; readonly end: Position }

export interface Node { readonly range: Range }

export interface Ident extends Node { readonly name: string }

/** A date as written: the parser keeps the parts; compute/ turns them into an instant. */
export type DateLit =
  | (Node & { readonly form: 'calendar'; readonly year: number; readonly month: number; readonly day: number; readonly hour: number; readonly minute: number; readonly second: number; readonly scale: 'UTC' | 'TT'; readonly text: string })
  | (Node & { readonly form: 'jd'; readonly jd: number; readonly scale: 'UTC' | 'TT'; readonly text: string });

export type Expr =
  | (Node & { readonly type: 'number'; readonly value: number; readonly unit?: string; readonly unitRange?: Range; readonly sigma?: number; readonly sigmaUnit?: string })
  | (Node & { readonly type: 'name'; readonly name: string })
  | (Node & { readonly type: 'call'; readonly fn: Ident; readonly args: readonly Expr[] })
  | (Node & { readonly type: 'binary'; readonly op: '+' | '-' | '*' | '/'; readonly left: Expr; readonly right: Expr })
  | (Node & { readonly type: 'neg'; readonly operand: Expr });

export type SeenFrom = 'sun' | 'earth';

interface Span { readonly from: DateLit; readonly to: DateLit }

export type Statement =
  | (Node & { readonly kind: 'date'; readonly date: DateLit })
  | (Node & { readonly kind: 'let'; readonly name: Ident; readonly expr: Expr })
  | (Node & { readonly kind: 'body'; readonly name: Ident; readonly period: Expr; readonly mass?: Expr })
  | (Node & { readonly kind: 'synodic'; readonly a: Expr; readonly b: Expr; readonly span?: Span })
  | (Node & { readonly kind: 'ratio'; readonly a: Expr; readonly b: Expr; readonly upTo?: number })
  | (Node & { readonly kind: 'relation'; readonly bodies: readonly Expr[]; readonly upTo?: number; readonly top?: number })
  | (Node & { readonly kind: 'conjunctions'; readonly a: Ident; readonly b: Ident; readonly span: Span; readonly seenFrom: SeenFrom; readonly within?: Expr })
  | (Node & { readonly kind: 'oppositions'; readonly a: Ident; readonly span: Span })
  | (Node & { readonly kind: 'alignment'; readonly bodies: readonly Ident[]; readonly against: readonly Ident[]; readonly within: Expr; readonly span: Span; readonly seenFrom: SeenFrom })
  | (Node & { readonly kind: 'barycentre'; readonly span: Span; readonly step?: Expr })
  | (Node & { readonly kind: 'series'; readonly name: Ident; readonly path: string; readonly pathRange: Range; readonly timeColumn: string; readonly valueColumn: string; readonly timeUnit: 'yr' | 'd' | 'jd' })
  | (Node & { readonly kind: 'periodogram'; readonly target: Ident; readonly periods?: { readonly from: Expr; readonly to: Expr }; readonly peaks?: number; readonly mark?: readonly Expr[] })
  | (Node & { readonly kind: 'set'; readonly key: 'seed' | 'calendar'; readonly value: string; readonly valueRange: Range });

export type StatementKind = Statement['kind'];

export const STATEMENT_KEYWORDS: readonly StatementKind[] = [
  'date', 'let', 'body', 'synodic', 'ratio', 'relation', 'conjunctions', 'oppositions',
  'alignment', 'barycentre', 'series', 'periodogram', 'set',
];

/** One `orbit` fence in a note. */
export interface Block {
  /** Optional slug after `orbit` in the info string. */
  readonly name?: string;
  /** 0-based line of the opening fence. */
  readonly fenceLine: number;
  /** 0-based line of the closing fence (or last line of the note when unclosed). */
  readonly closeLine: number;
  /** 0-based document line of the first content line. */
  readonly contentStartLine: number;
  /** Raw content (between the fences). */
  readonly content: string;
  /** Index of the block in the note (0-based). */
  readonly index: number;
}

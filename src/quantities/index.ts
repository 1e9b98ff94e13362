/** What can be measured, in which units, how it reaches the engine, and what each trade expects. */

export * from './table';
export * from './trades';

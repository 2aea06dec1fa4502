export * from './instant.ts';
export * from './leapSeconds.ts';
export * from './timeSystem.ts';
export * from './duration.ts';
export * from './calendar.ts';

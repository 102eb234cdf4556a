export * from './accounts';
export * from './teams';
export * from './ops';
export * from './scenes';
export * from './tokens';
export * from './calendars';

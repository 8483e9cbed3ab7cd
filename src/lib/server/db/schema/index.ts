export * from './auth';
export * from './labs';
export * from './audit';
export * from './register';
export * from './limits';
export * from './reviews';
export * from './inspections';
export * from './training';

export * from './auth';
export * from './review';
export * from './activity';

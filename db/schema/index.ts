export * from './auth';
export * from './review';
export * from './activity';
export * from './board';
export * from './settings';
export * from './decision';
export * from './site-year';
export * from './robustness';

/**
 * The product's words for better-auth's generated tables: a Team is an `organization`, a
 * team member a `member`. Code outside the generated file uses these names.
 */
export { organization as team, member as teamMember, invitation as teamInvitation } from './auth';

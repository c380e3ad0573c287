/**
 * @tropline/core: the engine and the contract. No Angular, no Express, no Knex.
 * Every public name is listed here one by one.
 */
export const CORE_VERSION = '0.1.0';

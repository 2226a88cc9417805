import type { ModelCtor } from 'sequelize-typescript';

/**
 * Every sequelize-typescript model of the server. Add a feature's models here (and its table in a
 * db/migrations file); SequelizeModule.forFeature() then hands out their repositories.
 */
export const MODELS: readonly ModelCtor[] = [];

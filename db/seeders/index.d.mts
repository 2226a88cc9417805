import type { Sequelize } from 'sequelize';

export interface SignIn {
  email: string;
  password: string;
  role: string;
}
export declare function seedDemo(sequelize: Sequelize): Promise<{ seeders: string[]; signIns: SignIn[] }>;

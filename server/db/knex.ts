import knex, { type Knex } from 'knex'
import { knexConfig } from '../../knexfile'

export type Db = Knex

export function createDb(url: string): Db {
  return knex(knexConfig(url))
}

// Every table the app knows; drizzle-kit reads this folder, drizzle() gets this object for db.query.*.
export * from './users'
export * from './groups'
export * from './memberships'

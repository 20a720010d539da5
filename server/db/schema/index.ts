export * from './lakes'
export * from './users'

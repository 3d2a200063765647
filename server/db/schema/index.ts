export * from './users'
export * from './projects'
export * from './audit'
export * from './relations'

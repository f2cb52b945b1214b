// Stands in for `server-only` under Vitest, where the react-server export condition is not set.
export {};

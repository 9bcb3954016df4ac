// vitest stand-in for the "server-only" marker package (tests run on the server anyway).
export {};

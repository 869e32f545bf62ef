// Seed steps of modules beyond the foundation register themselves here (import for side effects).
export {}

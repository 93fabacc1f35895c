// Imported first by the sweep integration tests: the server modules parse the environment
// when they load, so the test database and queue prefix must be set before any of them.
process.env.LOFTWISE_ENV = 'test';
process.env.LOG_LEVEL ??= 'warn';

import { existsSync } from 'node:fs';

// The checkout's .env when there is one (`npm start` writes it); variables already set win, so a
// deployment's own environment is never overridden.
if (existsSync('.env')) process.loadEnvFile('.env');

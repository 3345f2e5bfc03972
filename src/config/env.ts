import { z } from 'zod';

const envSchema = z.object({
  // The API is served from the same origin in every environment (Vite proxies it in development).
  VITE_API_BASE: z.string().startsWith('/').default('/api'),
});

export const env = envSchema.parse(import.meta.env);

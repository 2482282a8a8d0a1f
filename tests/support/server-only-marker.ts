// Integration tests run server modules outside Next.js; 'server-only' would throw there.
export {};

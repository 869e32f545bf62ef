import react from '@vitejs/plugin-react'
import { defineConfig } from 'vite'

// Client build. `npm run dev` serves on 5173 and proxies /api to the API server on 3000.
export default defineConfig({
  plugins: [react()],
  build: {
    outDir: 'dist',
    sourcemap: false,
    chunkSizeWarningLimit: 600,
  },
  server: {
    port: 5173,
    proxy: { '/api': 'http://127.0.0.1:3000' },
  },
})

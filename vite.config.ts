import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { build, defineConfig, type Plugin } from "vite";

/**
 * The compute pool's worker (app/lib/compute/worker.ts) runs in its own thread from its own file,
 * so the server build emits it beside the server bundle as computeWorker.js, where
 * app/lib/compute/pool.server.ts looks for it.
 */
function computeWorker(): Plugin {
  return {
    name: "kilostep-compute-worker",
    apply: "build",
    async writeBundle(options) {
      if (this.environment.name !== "ssr" || !options.dir) return;
      await build({
        configFile: false,
        logLevel: "warn",
        build: {
          ssr: "app/lib/compute/worker.ts",
          outDir: options.dir,
          emptyOutDir: false,
          copyPublicDir: false,
          rollupOptions: { output: { entryFileNames: "computeWorker.js", format: "es" } },
        },
      });
    },
  };
}

export default defineConfig({
  plugins: [tailwindcss(), reactRouter(), computeWorker()],
  server: { port: 3000 },
});

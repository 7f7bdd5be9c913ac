/** Node arguments that run the production server (src/cli/serve.ts); `npm start`, tests and benches use them. */
export const SERVE_ARGS = ["--conditions=react-server", "--import", "tsx", "src/cli/serve.ts"];

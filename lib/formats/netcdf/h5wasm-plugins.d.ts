/** Local declaration for h5wasm-plugins 0.2.1, which ships no types (only what we call). */
declare module 'h5wasm-plugins' {
  /** Adds the package's bundled plugin folder to HDF5's plugin search path of an h5wasm module. */
  export function install_local_plugins(h5wasmModule: unknown): void;
  export const plugin_names: readonly string[];
}

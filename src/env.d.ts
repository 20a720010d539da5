/// <reference types="vite/client" />

/** The build's label (`CHOPLINE_BUILD`, else the commit), written in by vite.config.ts. */
interface ImportMetaEnv {
  readonly CHOPLINE_BUILD: string
}

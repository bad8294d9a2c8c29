/** Vite's `?raw` imports: a file's text bundled as a string (used for the bundled example files). */
declare module '*?raw' {
  const text: string;
  export default text;
}

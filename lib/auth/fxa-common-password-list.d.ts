// fxa-common-password-list ships no type declarations; its one export is typed here.
declare module 'fxa-common-password-list' {
  const list: { test(password: string): boolean };
  export default list;
}

// The zipcodes package ships no types; only what server/lib/postal-codes.ts uses.
declare module 'zipcodes' {
  export function lookup(code: string): { zip: string; latitude: number; longitude: number; city: string; state: string; country: string } | undefined;
}

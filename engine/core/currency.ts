/**
 * ISO 4217 active currency codes and their minor-unit exponents (the number of digits
 * after the decimal point). Transcribed from the ISO 4217 list one (active codes);
 * funds codes and precious metals (XAU, XDR …) are left out because statements do not
 * use them. Codes not listed default to 2 only through `minorUnitExponent`'s caller,
 * never silently: `isKnownCurrency` lets importers refuse them.
 */
const EXPONENTS: Readonly<Record<string, number>> = (() => {
  const table: Record<string, number> = {};
  const zero = 'BIF CLP DJF GNF ISK JPY KMF KRW PYG RWF UGX UYI VND VUV XAF XOF XPF';
  const three = 'BHD IQD JOD KWD LYD OMR TND';
  const four = 'CLF UYW';
  const two =
    'AED AFN ALL AMD ANG AOA ARS AUD AWG AZN BAM BBD BDT BGN BMD BND BOB BRL BSD BTN BWP BYN ' +
    'BZD CAD CDF CHF CNY COP CRC CUP CVE CZK DKK DOP DZD EGP ERN ETB EUR FJD FKP GBP GEL GHS ' +
    'GIP GMD GTQ GYD HKD HNL HTG HUF IDR ILS INR IRR JMD KES KGS KHR KPW KYD KZT LAK LBP LKR ' +
    'LRD LSL MAD MDL MGA MKD MMK MNT MOP MRU MUR MVR MWK MXN MYR MZN NAD NGN NIO NOK NPR NZD ' +
    'PAB PEN PGK PHP PKR PLN QAR RON RSD RUB SAR SBD SCR SDG SEK SGD SHP SLE SOS SRD SSP STN ' +
    'SVC SYP SZL THB TJS TMT TOP TRY TTD TWD TZS UAH USD UYU UZS VED VES WST XCD XCG YER ZAR ZMW ZWG';
  for (const code of zero.split(' ')) table[code] = 0;
  for (const code of two.split(' ')) table[code] = 2;
  for (const code of three.split(' ')) table[code] = 3;
  for (const code of four.split(' ')) table[code] = 4;
  return table;
})();

/** True when `code` is an active ISO 4217 currency code. @example isKnownCurrency('EUR') // true */
export function isKnownCurrency(code: string): boolean {
  return Object.prototype.hasOwnProperty.call(EXPONENTS, code);
}

/**
 * Minor-unit exponent of an ISO 4217 code.
 * @returns undefined for an unknown code.
 * @example minorUnitExponent('JPY') // 0
 */
export function minorUnitExponent(code: string): number | undefined {
  return isKnownCurrency(code) ? EXPONENTS[code] : undefined;
}

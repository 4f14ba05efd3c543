import QRCode from 'qrcode';

/**
 * The report's verification address as a QR code (PNG), printed beside the report code so an inspector
 * holding paper reaches the `/verify` page by camera. Level M survives a crease or a smudge
 * (qrcode's documented levels: L 7 %, M 15 %, Q 25 %, H 30 % of codewords restorable); a four-module
 * quiet zone is what the QR symbology asks for around the symbol.
 */
export function verifyQrPng(verifyUrl: string): Promise<Buffer> {
  return QRCode.toBuffer(verifyUrl, { type: 'png', errorCorrectionLevel: 'M', margin: 4, scale: 8, color: { dark: '#000000', light: '#ffffff' } });
}

import sharp from 'sharp';

/** A camera-sized test photo made on the spot (no real photos in the repository). */
export async function testPhoto(label: string, width = 3000, height = 2000) {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
    <rect width="100%" height="100%" fill="#6b5a3a"/><rect x="40%" y="10%" width="8%" height="85%" fill="#3d2f1c"/>
    <text x="5%" y="12%" font-size="160" fill="#fff">${label}</text></svg>`;
  return { name: `${label}.jpg`, mimeType: 'image/jpeg', buffer: await sharp(Buffer.from(svg)).jpeg({ quality: 90 }).toBuffer() };
}

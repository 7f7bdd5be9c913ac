/** `npm run backup -- <file>`: an online backup of GRAINLINE_DB while the server runs. */
import { backupDatabase } from "../db/backup";

const source = process.env.GRAINLINE_DB || "data/grainline.db";
const destination = process.argv[2];
if (!destination) {
  console.error("Usage: npm run backup -- <backup-file.db>");
  process.exit(2);
}
const { pages } = await backupDatabase(source, destination);
console.log(`Backed up ${source} to ${destination} (${pages} pages).`);

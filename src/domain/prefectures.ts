/**
 * Japan's 47 prefectures: ISO 3166-2:JP code, the English (romanised) name and the Japanese
 * name as ISO 3166-2:JP gives them (北海道, 東京都, 京都府, 大阪府 and 43 …県).
 */
export type Prefecture = { code: string; en: string; ja: string };

const TABLE = `01 Hokkaido 北海道|02 Aomori 青森県|03 Iwate 岩手県|04 Miyagi 宮城県|05 Akita 秋田県|06 Yamagata 山形県|07 Fukushima 福島県|08 Ibaraki 茨城県|09 Tochigi 栃木県|10 Gunma 群馬県|11 Saitama 埼玉県|12 Chiba 千葉県|13 Tokyo 東京都|14 Kanagawa 神奈川県|15 Niigata 新潟県|16 Toyama 富山県|17 Ishikawa 石川県|18 Fukui 福井県|19 Yamanashi 山梨県|20 Nagano 長野県|21 Gifu 岐阜県|22 Shizuoka 静岡県|23 Aichi 愛知県|24 Mie 三重県|25 Shiga 滋賀県|26 Kyoto 京都府|27 Osaka 大阪府|28 Hyogo 兵庫県|29 Nara 奈良県|30 Wakayama 和歌山県|31 Tottori 鳥取県|32 Shimane 島根県|33 Okayama 岡山県|34 Hiroshima 広島県|35 Yamaguchi 山口県|36 Tokushima 徳島県|37 Kagawa 香川県|38 Ehime 愛媛県|39 Kochi 高知県|40 Fukuoka 福岡県|41 Saga 佐賀県|42 Nagasaki 長崎県|43 Kumamoto 熊本県|44 Oita 大分県|45 Miyazaki 宮崎県|46 Kagoshima 鹿児島県|47 Okinawa 沖縄県`;

export const PREFECTURES: readonly Prefecture[] = TABLE.split("|").map((row) => {
  const [n, en, ja] = row.split(" ") as [string, string, string];
  return { code: `JP-${n}`, en, ja };
});

/**
 * One spelling for the ways a prefecture is typed in Latin letters: case, macrons and
 * circumflexes (Hyōgo, Hyôgo), long vowels written out (Hyougo, Oosaka), a suffix
 * (Hyogo-ken, Osaka-fu, Tokyo-to, "Hyogo Prefecture"), and Hepburn or Kunrei romanisation
 * (Fukushima / Hukusima, Chiba / Tiba) are all brought to one key.
 */
export function romajiKey(name: string): string {
  return name
    .normalize("NFD")
    .replace(/\p{M}/gu, "")
    .toLowerCase()
    .trim()
    .replace(/[\s-]+(prefecture|pref\.?|ken|fu|to|metropolis)$/, "")
    .replace(/[^a-z]/g, "")
    .replace(/ou|oo/g, "o")
    .replace(/uu/g, "u")
    .replace(/shi/g, "si")
    .replace(/chi/g, "ti")
    .replace(/tsu/g, "tu")
    .replace(/fu/g, "hu")
    .replace(/ji/g, "zi");
}

const BY_KEY = new Map(PREFECTURES.map((p) => [romajiKey(p.en), p]));
// 北海道 keeps its 道; the others are also written without 県/府/都.
const BY_KANJI = new Map(PREFECTURES.flatMap((p) => [[p.ja, p] as const, ...(p.code === "JP-01" ? [] : [[p.ja.slice(0, -1), p] as const])]));

/** The prefecture a stored region names (romanised or in kanji), or null (a country, a place we do not know). */
export function findPrefecture(region: string): Prefecture | null {
  const trimmed = region.trim();
  return BY_KANJI.get(trimmed) ?? BY_KEY.get(romajiKey(trimmed)) ?? null;
}

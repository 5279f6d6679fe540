import type { RootstockFields, VarietyFields } from '../../../../shared/types/catalogue'

/**
 * Reference catalogue: cider apple and perry pear varieties, apple and pear
 * rootstocks. Plain typed data; a Knex seed maps the camelCase fields to the
 * snake_case columns of `varieties` and `rootstocks`.
 *
 * Read before using these numbers:
 *
 * - A variety's `juiceClass` is DATA: the label the trade and the cited source
 *   give it. It does NOT always follow the Long Ashton thresholds (acid
 *   4.5 g/L as malic, tannin 2.0 g/L). Examples kept on purpose:
 *   Kingston Black is a published bittersharp, yet WSU measured tannin
 *   1.7 g/L; Brown Snout is a published bittersweet at 1.9 g/L tannin;
 *   Perthyre is listed bittersweet by Long Ashton with 1.8 g/L tannin;
 *   White Jersey sits exactly on the 2.0 g/L line. The class computed from a
 *   juice reading is a separate thing (server/utils), never this column.
 * - Composition varies with site, season, ripeness and sweating; values are
 *   typical figures from one source, not specifications.
 * - Units: TA in g/L expressed as malic acid; tannin in g/L. Older tables give
 *   "% w/v"; those are multiplied by 10 (0.20 % -> 2.0 g/L). Long Ashton and
 *   WSU tannin figures are Lowenthal permanganate titrations ("tannic acid");
 *   other sources may use other methods, so tannin values are not strictly
 *   comparable between sources.
 * - Where a source gives specific gravity, °Brix is converted with the cubic
 *   °Bx = ((182.4601 S - 775.6821) S + 1262.7794) S - 669.5622
 *   (a cubic fit to the NBS sucrose tables) and rounded to 0.1; the row says so.
 * - Harvest season: Long Ashton's "early/mid" is mapped to `early`; other rows
 *   use the cited description or are marked "from memory".
 * - Perry pears have their own published classes (Pollard and Beech: sweet,
 *   medium sharp, bittersweet, bittersharp). A pear's class is the published
 *   one where a list names it, else computed from its acid and tannin with the
 *   pear thresholds (stated on each row). Pear juice also carries sorbitol, so
 *   °Brix overstates potential alcohol.
 * - Rootstocks: tree size as % of seedling and bearing age come from extension
 *   publications where found. Yield per tree at full bearing is seldom
 *   published per rootstock; those values are common-practice figures marked
 *   "from memory". Spacings are typical, not recommendations for a site.
 * - Any value whose source string says "from memory" was recalled, not read
 *   from a source, and should be checked before it is relied on.
 */

export interface CatalogueVariety extends VarietyFields {
  /** Where the class and numbers come from; "from memory" marks unsourced values. */
  source: string
}

export interface CatalogueRootstock extends RootstockFields {
  /** Where the figures come from; "from memory" marks unsourced values. */
  source: string
}

// ---------------------------------------------------------------------------
// Source strings (shared prefixes)
// ---------------------------------------------------------------------------

const LEA
  = "A. Lea, 'Cider Apple Compositional Data' (Long Ashton Research Station composite juice analyses 1905-1975), http://cider.org.uk/appledat.htm: class, season, malic acid % and tannin % (x10 -> g/L)"

const WSU_MV
  = 'WSU Mount Vernon NWREC cider apple juice analyses 2003-2013, means of tannin %, malic acid g/L and °Brix (C. Miles et al.; table reproduced in P. Vossen, UCCE Sonoma-Marin, cider presentation)'

const WSU_TYPES
  = "C. Miles & J. King, WSU Mount Vernon NWREC, 'Cider Apple Varieties and Juice Quality' (examples of varieties by type)"

const UMASS
  = "UMass Extension Fruit Program, 'New England Cider Apple Program at the NEVFC'"

const WIKI_TYPES
  = "Wikipedia, 'Cider apple' (Long Ashton four-class table, examples citing Miles, King & Peck 2015 and Merwin et al. 2008)"

const ONTARIO
  = "D. Plotkowski & J. Cline (2021), 'Evaluation of selected cider apple cultivars grown in Ontario. II. Juice attributes', Can. J. Plant Sci. 101(6), abstract"

const GOVERD
  = 'Goverd et al., acid % as malic and pH of six apple varieties, as summarised in a food-safety text on apple cider'

const BROOKS_OLMO
  = 'Brooks and Olmo Register of Fruit & Nut Varieties, perry pear entry, as reproduced in online cultivar descriptions of the US pear germplasm collection: juice acidity % (taken as malic, x10 -> g/L), tannins % (x10 -> g/L), specific gravity'

const POLLARD_BEECH
  = "Class: the perry pear classes of Pollard and Beech (sweet, medium sharp, bittersweet, bittersharp), as listed in 'Perry Pear Varieties' (homepage.ntlworld.com/scrumpy) and cider-making.co.uk's perry pear lists"

const POLLARD_BEECH_COMPUTED
  = 'Class: not in the published perry pear lists seen; computed from these acid and tannin figures with the Pollard and Beech thresholds'

const NCSU
  = "NC State Extension, 'Apple Rootstocks and Tree Spacing', Table 1 (tree size as % of seedling, non-spur scion; fruit bearing age in years)"

const EXT_APPLES = 'eXtension Apples (Cooperative Extension), apples.extension.org'

// ---------------------------------------------------------------------------
// Varieties
// ---------------------------------------------------------------------------

export const varieties: CatalogueVariety[] = [
  // ----- Bittersweet apples -----
  {
    name: 'Dabinett',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: 14.0,
    typicalTaGPerL: 2.55,
    typicalTanninGPerL: 2.9,
    harvestSeason: 'late',
    source: `Class: ${UMASS}; ${WSU_TYPES}. Numbers: ${WSU_MV} (tannin 0.29 %, malic 2.55 g/L, 14.0 °Bx). Season: National Fruit Collection (Brogdale) record, picking time mid November.`,
  },
  {
    name: 'Yarlington Mill',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: 12.0,
    typicalTaGPerL: 2.2,
    typicalTanninGPerL: 3.2,
    harvestSeason: 'late',
    source: `Class: ${UMASS}; ${WIKI_TYPES}. Numbers: online cultivar database entry giving must 10-14 °Brix (midpoint used), tannin 0.32 %, acid 0.22 % (secondary source). Season: J. Morgan, The New Book of Apples (harvest late Oct to mid Nov).`,
  },
  {
    name: 'Harry Masters Jersey',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: 13.8,
    typicalTaGPerL: 2.0,
    typicalTanninGPerL: 3.2,
    harvestSeason: 'late',
    source: `Class: ${WSU_TYPES}. Numbers: US nursery catalogue description quoting SG 1.056, acidity 0.20 %, tannin 0.32 % (secondary source); °Brix converted from SG 1.056. Season: late (from memory; descriptions give late October).`,
  },
  {
    name: 'Chisel Jersey',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: null,
    typicalTaGPerL: null,
    typicalTanninGPerL: null,
    harvestSeason: 'late',
    source: `Class: ${WIKI_TYPES} (a 'full bittersweet'); ${WSU_TYPES}. No composition found in a searchable source. Season: late (from memory).`,
  },
  {
    name: 'Major',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: null,
    typicalTaGPerL: 1.8,
    typicalTanninGPerL: 4.1,
    harvestSeason: 'early',
    source: `${LEA} (Early, Bittersweet, malic 0.18 %, tannin 0.41 %).`,
  },
  {
    name: 'Michelin',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: 12.4,
    typicalTaGPerL: 2.5,
    typicalTanninGPerL: 4.4,
    harvestSeason: 'mid',
    source: `Class and season: Wikipedia 'Michelin (apple)', citing L. Copas, A Somerset Pomona (2001) p. 49 (mid-season medium bittersweet). Numbers: SG 1.050, TA 2.5 g/L, tannin 4.4 g/L as quoted in a Canadian nursery description citing C. Jolicoeur, The New Cidermaker's Handbook, and WSU data (secondary source); °Brix converted from SG 1.050.`,
  },
  {
    name: 'Ellis Bitter',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: null,
    typicalTaGPerL: 2.0,
    typicalTanninGPerL: 2.4,
    harvestSeason: 'early',
    source: `${LEA} (Early, Bittersweet, malic 0.20 %, tannin 0.24 %).`,
  },
  {
    name: "Medaille d'Or",
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: 15.8,
    typicalTaGPerL: 3.43,
    typicalTanninGPerL: null,
    harvestSeason: 'late',
    source: `Numbers: ${WSU_MV} (malic 3.43 g/L, 15.8 °Bx). Its tannin, 1.05 % as tannic acid equivalents, is a different measure from the juice-test g/L figures here and more than twice any bittersweet in the Long Ashton data (A. Lea), so no tannin figure is stored. Class bittersweet (traditional English label). Season: late (from memory; Canadian budwood description gives late-season harvest).`,
  },
  {
    name: 'Brown Snout',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: 13.5,
    typicalTaGPerL: 3.37,
    typicalTanninGPerL: 1.9,
    harvestSeason: 'late',
    source: `Class: ${WIKI_TYPES} (published bittersweet; note WSU tannin 1.9 g/L is below the 2.0 g/L threshold). Numbers: ${WSU_MV} (tannin 0.19 %, malic 3.37 g/L, 13.5 °Bx). Season: late (from memory).`,
  },
  {
    name: "Tremlett's Bitter",
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: null,
    typicalTaGPerL: 2.7,
    typicalTanninGPerL: 3.4,
    harvestSeason: 'early',
    source: `${LEA} (Early/mid, Bittersweet, malic 0.27 %, tannin 0.34 %).`,
  },
  {
    name: "Bulmer's Norman",
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: null,
    typicalTaGPerL: 2.4,
    typicalTanninGPerL: 2.7,
    harvestSeason: 'early',
    source: `${LEA} (Early/mid, Bittersweet, malic 0.24 %, tannin 0.27 %).`,
  },
  {
    name: 'Somerset Redstreak',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: null,
    typicalTaGPerL: 1.9,
    typicalTanninGPerL: 2.8,
    harvestSeason: 'early',
    source: `${LEA} (Early/mid, Bittersweet, malic 0.19 %, tannin 0.28 %).`,
  },
  {
    name: 'White Jersey',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: null,
    typicalTaGPerL: 1.4,
    typicalTanninGPerL: 2.0,
    harvestSeason: 'early',
    source: `${LEA} (Early/mid, Bittersweet, malic 0.14 %, tannin 0.20 %: exactly on the tannin threshold).`,
  },
  {
    name: 'Perthyre',
    species: 'apple',
    juiceClass: 'bittersweet',
    typicalBrix: null,
    typicalTaGPerL: 3.3,
    typicalTanninGPerL: 1.8,
    harvestSeason: 'early',
    source: `${LEA} (Early/mid, Bittersweet, malic 0.33 %, tannin 0.18 %: published bittersweet although tannin is below the threshold).`,
  },

  // ----- Bittersharp apples -----
  {
    name: 'Kingston Black',
    species: 'apple',
    juiceClass: 'bittersharp',
    typicalBrix: 13.4,
    typicalTaGPerL: 6.45,
    typicalTanninGPerL: 1.7,
    harvestSeason: 'late',
    source: `Class: ${UMASS}; ${WSU_TYPES} (published bittersharp; WSU tannin 1.7 g/L is below the threshold). Numbers: ${WSU_MV} (tannin 0.17 %, malic 6.45 g/L, 13.4 °Bx). Season: late (from memory; descriptions range mid-late to November).`,
  },
  {
    name: 'Foxwhelp',
    species: 'apple',
    juiceClass: 'bittersharp',
    typicalBrix: null,
    typicalTaGPerL: 19.1,
    typicalTanninGPerL: 2.2,
    harvestSeason: 'early',
    source: `${LEA}, row 'Bulmers / Broxwood Foxwhelp' (Early, Bittersharp, malic 1.91 %, tannin 0.22 %); other Foxwhelp clones differ.`,
  },
  {
    name: 'Stoke Red',
    species: 'apple',
    juiceClass: 'bittersharp',
    typicalBrix: 12.9,
    typicalTaGPerL: 6.4,
    typicalTanninGPerL: 3.1,
    harvestSeason: 'late',
    source: `Class: ${WSU_TYPES}. Numbers: SG 1.052, TA 6.4 g/L, tannin 3.1 g/L as quoted in a Canadian nursery description citing C. Jolicoeur, The New Cidermaker's Handbook, and WSU data (secondary source); °Brix converted from SG 1.052. Season: late (from memory; UK descriptions give November).`,
  },
  {
    name: "Porter's Perfection",
    species: 'apple',
    juiceClass: 'bittersharp',
    typicalBrix: 13.3,
    typicalTaGPerL: 8.2,
    typicalTanninGPerL: 2.5,
    harvestSeason: 'late',
    source: `Class: ${WSU_TYPES}. Numbers: US nursery catalogue description quoting SG 1.054, acidity 8.2 g/L, tannin 2.5 g/L (secondary source); °Brix converted from SG 1.054. Season: late (descriptions give late autumn / late October).`,
  },
  {
    name: "Breakwell's Seedling",
    species: 'apple',
    juiceClass: 'bittersharp',
    typicalBrix: 10.9,
    typicalTaGPerL: 6.4,
    typicalTanninGPerL: 2.3,
    harvestSeason: 'early',
    source: `Class, season, acid and tannin: ${LEA} (Early, Bittersharp, malic 0.64 %, tannin 0.23 %). °Brix: ${WSU_MV} (10.9 °Bx; WSU measured malic 7.82 g/L, tannin 0.27 %).`,
  },
  {
    name: 'Wickson',
    species: 'apple',
    juiceClass: 'bittersharp',
    typicalBrix: null,
    typicalTaGPerL: null,
    typicalTanninGPerL: null,
    harvestSeason: 'mid',
    source: `Class: ${UMASS} ('Wickson Crab' listed as bittersharp). Composition not found in an extension source (descriptions stress very high sugar). Season: mid (from memory; descriptions give mid October).`,
  },

  // ----- Sharp apples -----
  {
    name: "Brown's Apple",
    species: 'apple',
    juiceClass: 'sharp',
    typicalBrix: 10.6,
    typicalTaGPerL: 7.2,
    typicalTanninGPerL: 1.3,
    harvestSeason: 'mid',
    source: `Class, season, acid and tannin: ${LEA} (Mid, Sharp, malic 0.72 %, tannin 0.13 %). °Brix: ${ONTARIO} (10.6 °Bx, lowest of 28 cultivars).`,
  },
  {
    name: "Bramley's Seedling",
    species: 'apple',
    juiceClass: 'sharp',
    typicalBrix: null,
    typicalTaGPerL: 14.3,
    typicalTanninGPerL: null,
    harvestSeason: 'late',
    source: `Class: ${WSU_TYPES}. TA: ${GOVERD} (1.43 % as malic, pH 2.92); ${ONTARIO} gives '191 mg malic acid per 100 mL' for Bramley in Ontario, 1.91 g/L as printed, which cannot be right for this sharp cooker (probably 19.1 g/L; the paper's table was not to hand), so it is not used. Season: late (from memory).`,
  },
  {
    name: 'Frederick',
    species: 'apple',
    juiceClass: 'sharp',
    typicalBrix: null,
    typicalTaGPerL: 10.2,
    typicalTanninGPerL: 0.9,
    harvestSeason: 'early',
    source: `${LEA} (Early, Sharp, malic 1.02 %, tannin 0.09 %).`,
  },
  {
    name: 'Golden Russet',
    species: 'apple',
    juiceClass: 'sharp',
    typicalBrix: 16.9,
    typicalTaGPerL: 6.64,
    typicalTanninGPerL: 1.3,
    harvestSeason: 'late',
    source: `Class: ${UMASS}. Numbers: ${WSU_MV} (tannin 0.13 %, malic 6.64 g/L, 16.9 °Bx). Season: late (from memory).`,
  },
  {
    name: 'Harrison',
    species: 'apple',
    juiceClass: 'sharp',
    typicalBrix: 15.8,
    typicalTaGPerL: 7.77,
    typicalTanninGPerL: 1.6,
    harvestSeason: 'late',
    source: `Class: ${WSU_TYPES} (listed as sharp; WSU values meet the thresholds). Numbers: ${WSU_MV} (tannin 0.16 %, malic 7.77 g/L, 15.8 °Bx; only 3 years of data). Season: late (from memory).`,
  },
  {
    name: "Ashmead's Kernel",
    species: 'apple',
    juiceClass: 'sharp',
    typicalBrix: 18.3,
    typicalTaGPerL: null,
    typicalTanninGPerL: null,
    harvestSeason: 'late',
    source: `Class: ${UMASS}. °Brix: ${ONTARIO} (18.3 °Bx, highest of 28 cultivars). Season: late (from memory).`,
  },

  // ----- Sweet apples -----
  {
    name: 'Sweet Coppin',
    species: 'apple',
    juiceClass: 'sweet',
    typicalBrix: null,
    typicalTaGPerL: 1.7,
    typicalTanninGPerL: null,
    harvestSeason: 'mid',
    source: `Class: ${WIKI_TYPES}. TA: ${GOVERD} (0.17 % as malic, pH 4.03). Season: mid (from memory).`,
  },
  {
    name: 'Sweet Alford',
    species: 'apple',
    juiceClass: 'sweet',
    typicalBrix: null,
    typicalTaGPerL: null,
    typicalTanninGPerL: null,
    harvestSeason: 'mid',
    source: `Class: ${WIKI_TYPES}. TA: ${ONTARIO} gives the lowest of 28 cultivars as '31 mg malic acid per 100 mL' (pH 4.76); taken as printed that is 0.31 g/L, below any apple juice in the Long Ashton data (A. Lea: 1.1 g/L and up), and the paper's own table was not to hand, so no TA figure is stored. Season: mid (from memory).`,
  },
  {
    name: 'Court Royal',
    species: 'apple',
    juiceClass: 'sweet',
    typicalBrix: null,
    typicalTaGPerL: 2.1,
    typicalTanninGPerL: 1.1,
    harvestSeason: 'early',
    source: `${LEA} (Early, Sweet, malic 0.21 %, tannin 0.11 %).`,
  },
  {
    name: "Taylor's Sweet",
    species: 'apple',
    juiceClass: 'sweet',
    typicalBrix: null,
    typicalTaGPerL: 1.8,
    typicalTanninGPerL: 1.4,
    harvestSeason: 'early',
    source: `${LEA} (Early/mid, Sweet, malic 0.18 %, tannin 0.14 %).`,
  },

  // ----- Perry pears -----
  {
    name: 'Blakeney Red',
    species: 'pear',
    juiceClass: 'medium sharp',
    typicalBrix: 13.8,
    typicalTaGPerL: 4.2,
    typicalTanninGPerL: 1.3,
    harvestSeason: 'mid',
    source: `${BROOKS_OLMO} (acidity 0.42, tannins 0.13, SG 1.056; midseason; 'moderate acids and tannins'). °Brix converted from SG 1.056. ${POLLARD_BEECH} (medium sharp).`,
  },
  {
    name: 'Thorn',
    species: 'pear',
    juiceClass: 'medium sharp',
    typicalBrix: 15.2,
    typicalTaGPerL: 5.7,
    typicalTanninGPerL: 1.0,
    harvestSeason: 'early',
    source: `${BROOKS_OLMO} (acidity 0.57, tannins 0.10, SG 1.062; early-mid season, ripens mid-late September). °Brix converted from SG 1.062. ${POLLARD_BEECH_COMPUTED} (a nursery description quoting Jolicoeur calls it bittersharp).`,
  },
  {
    name: 'Hendre Huffcap',
    species: 'pear',
    juiceClass: 'sweet',
    typicalBrix: 14.5,
    typicalTaGPerL: 3.7,
    typicalTanninGPerL: 0.8,
    harvestSeason: 'mid',
    source: `${BROOKS_OLMO} (acidity 0.37, tannins 0.08, SG 1.059; midseason). °Brix converted from SG 1.059. ${POLLARD_BEECH} (sweet, although its acidity by these figures computes as medium sharp).`,
  },
  {
    name: 'Yellow Huffcap',
    species: 'pear',
    juiceClass: 'medium sharp',
    typicalBrix: 15.7,
    typicalTaGPerL: 6.2,
    typicalTanninGPerL: 1.0,
    harvestSeason: 'mid',
    source: `${BROOKS_OLMO} (acidity 0.62, tannins 0.10, SG 1.064; midseason; citric acid > 0.3 %). °Brix converted from SG 1.064. ${POLLARD_BEECH} (medium sharp).`,
  },
  {
    name: 'Brandy',
    species: 'pear',
    juiceClass: 'medium sharp',
    typicalBrix: 16.8,
    typicalTaGPerL: 4.4,
    typicalTanninGPerL: 1.2,
    harvestSeason: 'mid',
    source: `${BROOKS_OLMO} (acidity 0.44, tannins 0.12, SG 1.069 from older trees, lower from young trees; midseason). °Brix converted from SG 1.069. ${POLLARD_BEECH} (medium sharp).`,
  },
  {
    name: 'Gin',
    species: 'pear',
    juiceClass: 'medium sharp',
    typicalBrix: 12.9,
    typicalTaGPerL: 4.2,
    typicalTanninGPerL: 1.5,
    harvestSeason: 'late',
    source: `${BROOKS_OLMO} (acidity 0.42, tannins 0.15, SG 1.052; late season; citric acid > 0.3 %). °Brix converted from SG 1.052. ${POLLARD_BEECH} (medium sharp).`,
  },
  {
    name: 'Butt',
    species: 'pear',
    juiceClass: 'bittersharp',
    typicalBrix: 13.8,
    typicalTaGPerL: 5.4,
    typicalTanninGPerL: 3.2,
    harvestSeason: 'late',
    source: `${BROOKS_OLMO} (acidity 0.54, tannins 0.32, SG 1.056; late season, high tannin). °Brix converted from SG 1.056. ${POLLARD_BEECH} (bittersharp).`,
  },
  {
    name: 'Red Pear',
    species: 'pear',
    juiceClass: 'medium sharp',
    typicalBrix: 13.6,
    typicalTaGPerL: 2.9,
    typicalTanninGPerL: 0.9,
    harvestSeason: 'mid',
    source: `${BROOKS_OLMO} (acidity 0.29, tannins 0.09, SG 1.055; midseason). °Brix converted from SG 1.055. ${POLLARD_BEECH_COMPUTED}.`,
  },
  {
    name: 'Moorcroft',
    species: 'pear',
    juiceClass: 'bittersharp',
    typicalBrix: null,
    typicalTaGPerL: null,
    typicalTanninGPerL: null,
    harvestSeason: 'early',
    source:
      "Season: online cultivar description in the same format as the US pear germplasm descriptions (harvest mid to late September, mill up to 2 days after harvest). Class: bittersharp in the Pollard and Beech perry pear lists (cider-making.co.uk) and an Australian heritage-fruit nursery description ('bittersharp pear'); J. Morgan, The Book of Pears (2015) p. 262 describes medium acidity and tannin. No published numbers found; also known as Malvern Hills.",
  },
]

// ---------------------------------------------------------------------------
// Rootstocks
// ---------------------------------------------------------------------------

export const rootstocks: CatalogueRootstock[] = [
  // ----- Apple -----
  {
    designation: 'M.9',
    species: 'apple',
    vigour: 'dwarf',
    sizePctOfSeedling: 35,
    needsSupport: true,
    inRowM: 1.2,
    betweenRowM: 4.3,
    yearsToFirstCrop: 2,
    yearsToFirstCropLate: 3,
    yearsToFullBearing: 5,
    yieldPerTreeKg: 20,
    source: `Support, precocity ('very early'), class: ${EXT_APPLES}, 'Apple Rootstock Info: M.9' (requires full tree support) and 'Dwarfing Apple Rootstocks' (25-60 % of seedling; spacing down to 14 ft x 4 ft, used here). Size 35 %: from memory of ${NCSU}; nursery descriptions give 30-35 % (eXtension's M.9 table says 45-50 % of standard). First crop 2-3 y and full bearing 5 y: German Wikipedia 'M9 (Apfel)' (bears after 2-3 y, full size after 5 y). Yield: from memory (common practice).`,
  },
  {
    designation: 'G.41',
    species: 'apple',
    vigour: 'dwarf',
    sizePctOfSeedling: 35,
    needsSupport: true,
    inRowM: 1.1,
    betweenRowM: 3.5,
    yearsToFirstCrop: 2,
    yearsToFirstCropLate: 3,
    yearsToFullBearing: 5,
    yieldPerTreeKg: 20,
    source: `${EXT_APPLES}, 'Apple Rootstock Info: G.41': full dwarf similar in size to M.9 NAKBT337, early precocity, support needed (its table gives 50-55 %; 35 % used here to match M.9 on the NC State scale). Spacing: NMSU Guide H-307 'Rootstocks for Size Control in Apple Trees' (tall spindle 3-4 x 11-12 ft). First crop, full bearing and yield: from memory (common practice, as M.9). First crop 2-3 y: from memory (as M.9).`,
  },
  {
    designation: 'G.935',
    species: 'apple',
    vigour: 'dwarf',
    sizePctOfSeedling: 40,
    needsSupport: true,
    inRowM: 1.5,
    betweenRowM: 4.0,
    yearsToFirstCrop: 2,
    yearsToFirstCropLate: 3,
    yearsToFullBearing: 5,
    yieldPerTreeKg: 25,
    source: `${EXT_APPLES}, 'Apple Rootstock Info: G.935' (listed with dwarfing rootstocks; Rock Springs PA trial: tree about 9 % larger than M.9 and 12 % smaller than M.26; production efficiency equal to M.9). Size 40 % derived from that relation on the NC State scale. Support, spacing, first crop, full bearing and yield: from memory (common practice). First crop 2-3 y: from memory (as M.9).`,
  },
  {
    designation: 'G.11',
    species: 'apple',
    vigour: 'semi-dwarf',
    sizePctOfSeedling: 50,
    needsSupport: true,
    inRowM: 1.8,
    betweenRowM: 4.3,
    yearsToFirstCrop: 2,
    yearsToFirstCropLate: 3,
    yearsToFullBearing: 6,
    yieldPerTreeKg: 30,
    source: `${EXT_APPLES}, 'Apple Rootstock Info: G.11': similar in size to M.26, very early precocity, requires trunk support (its table gives 55-60 %; 50 % used to match M.26 on the NC State scale). Spacing, full bearing and yield: from memory (common practice). First crop 2-3 y: from memory (as M.26's early end).`,
  },
  {
    designation: 'M.26',
    species: 'apple',
    vigour: 'semi-dwarf',
    sizePctOfSeedling: 50,
    needsSupport: true,
    inRowM: 2.4,
    betweenRowM: 4.3,
    yearsToFirstCrop: 2,
    yearsToFirstCropLate: 4,
    yearsToFullBearing: 6,
    yieldPerTreeKg: 30,
    source: `Size 50 %, bearing age 2-4 y, anchorage poor: ${NCSU}. Class: ${EXT_APPLES} lists M.26 with semi-dwarfing rootstocks. Spacing, full bearing and yield: from memory (common practice).`,
  },
  {
    designation: 'M.7',
    species: 'apple',
    vigour: 'semi-dwarf',
    sizePctOfSeedling: 70,
    needsSupport: false,
    inRowM: 3.7,
    betweenRowM: 5.5,
    yearsToFirstCrop: 3,
    yearsToFirstCropLate: 4,
    yearsToFullBearing: 7,
    yieldPerTreeKg: 50,
    source: `Size 70 %, bearing age 3-4 y (row 'M.7a'), anchorage fair: ${NCSU}. In-row 12 ft and no permanent staking: NC Historic Sites, Horne Creek Farm 'Rootstock Information' table. Between-row spacing, full bearing and yield: from memory (common practice). Suckers heavily (NC State).`,
  },
  {
    designation: 'MM.106',
    species: 'apple',
    vigour: 'semi-vigorous',
    sizePctOfSeedling: 80,
    needsSupport: false,
    inRowM: 4.3,
    betweenRowM: 5.5,
    yearsToFirstCrop: 3,
    yearsToFirstCropLate: 4,
    yearsToFullBearing: 8,
    yieldPerTreeKg: 70,
    source: `Size 80 %, bearing age 3-4 y, anchorage excellent: ${NCSU}. Spacing, full bearing and yield: from memory (common practice for cider bush orchards).`,
  },
  {
    designation: 'MM.111',
    species: 'apple',
    vigour: 'vigorous',
    sizePctOfSeedling: 85,
    needsSupport: false,
    inRowM: 5.5,
    betweenRowM: 6.7,
    yearsToFirstCrop: 4,
    yearsToFirstCropLate: 6,
    yearsToFullBearing: 10,
    yieldPerTreeKg: 90,
    source: `Size 85 %, bearing age 4-6 y, anchorage excellent: ${NCSU}. ${EXT_APPLES}, 'Apple Rootstock Info: MM.111 EMLA' (85-100 % of seedling, free-standing) and its list of standard-size rootstocks. In-row 18 ft minimum: NC Historic Sites, Horne Creek Farm 'Rootstock Information' table. Between-row spacing, full bearing and yield: from memory (common practice).`,
  },
  {
    designation: 'Seedling',
    species: 'apple',
    vigour: 'vigorous',
    sizePctOfSeedling: 100,
    needsSupport: false,
    inRowM: 6.1,
    betweenRowM: 7.9,
    yearsToFirstCrop: 6,
    yearsToFirstCropLate: 10,
    yearsToFullBearing: 12,
    yieldPerTreeKg: 150,
    source: `Size 100 %, bearing age 6-10 y: ${NCSU}. Spacing 26 ft x 20 ft (with good pruning): ${EXT_APPLES}, 'Standard Apple Rootstocks'. Full bearing and yield: from memory (traditional standard cider orchards).`,
  },

  // Stocks a nursery propagates that came later (server/db/migrations/20261202_0009_nursery_rootstocks.ts
  // adds them to a catalogue seeded before; the two must agree, tests/unit/catalogueData.test.ts).
  {
    designation: 'Mark',
    species: 'apple',
    vigour: 'dwarf',
    sizePctOfSeedling: 35,
    needsSupport: true,
    inRowM: 1.2,
    betweenRowM: 4.3,
    yearsToFirstCrop: 2,
    yearsToFirstCropLate: 3,
    yearsToFullBearing: 5,
    yieldPerTreeKg: 20,
    source: `Size 35-40 % of standard (35 % used, the low end), precocity 'very early', tree support needed, class: ${EXT_APPLES}, 'Apple Rootstock Info: Mark' (an open-pollinated seedling of M.9, Michigan State University 1979; drought sensitive, irrigation recommended; root mass proliferation makes trees uneven) and its list of dwarfing rootstocks. ${NCSU} lists Mark at 50 %, not used here. Spacing 14 ft x 4 ft: ${EXT_APPLES}, 'Dwarfing Apple Rootstocks', as M.9. First crop 2-3 y, full bearing and yield: from memory (common practice, as M.9).`,
  },
  {
    designation: 'G.890',
    species: 'apple',
    vigour: 'semi-dwarf',
    sizePctOfSeedling: 50,
    needsSupport: false,
    inRowM: 3.0,
    betweenRowM: 4.6,
    yearsToFirstCrop: 2,
    yearsToFirstCropLate: 3,
    yearsToFullBearing: 6,
    yieldPerTreeKg: 30,
    source: `Size 50 %: about half a seedling tree (common practice); the Treco rootstock description 'Geneva 890' gives 40-50 % of seedling where it is grown like Washington State and 60-65 % like New York, free standing, precocious and productive (yield efficiency similar to or better than M.9), resistant to fire blight, crown rot and woolly apple aphid, rooting well in layer beds. Class: ${EXT_APPLES} lists G.890 with semi-dwarfing rootstocks. Spacing 10 ft x 15 ft (3.0 x 4.6 m): NMSU Guide H-307 'Rootstocks for Size Control in Apple Trees' (central leader systems 10-12 x 15-20 ft, lower figures used). First crop 2-3 y, full bearing and yield: from memory (common practice, as G.11 and M.26).`,
  },

  // ----- Pear -----
  {
    designation: 'Quince C',
    species: 'pear',
    vigour: 'dwarf',
    sizePctOfSeedling: 40,
    needsSupport: true,
    inRowM: 2.5,
    betweenRowM: 4.0,
    yearsToFirstCrop: 3,
    yearsToFirstCropLate: 4,
    yearsToFullBearing: 6,
    yieldPerTreeKg: 20,
    source:
      "More dwarfing than Quince A and less cold-hardy (grower reports; East Malling quince selections). Quince rootstocks usually crop within 3 years (UK nursery rootstock article). Not a US extension recommendation: WVU Extension notes quince is cold-sensitive. Some pear varieties are incompatible with quince and need an interstem. Size %, support, spacing, full bearing and yield: from memory (common UK practice). First crop 3-4 y: UK nursery pages ('usually within 3 years'; 'three to four years').",
  },
  {
    designation: 'Quince A',
    species: 'pear',
    vigour: 'semi-dwarf',
    sizePctOfSeedling: 50,
    needsSupport: true,
    inRowM: 3.0,
    betweenRowM: 4.5,
    yearsToFirstCrop: 3,
    yearsToFirstCropLate: 4,
    yearsToFullBearing: 7,
    yieldPerTreeKg: 25,
    source:
      "Most widely used pear rootstock in the UK; mature tree about 3-6 m (UK gardening guides); bush pear about 25 kg per tree (UK gardening guide); quince rootstocks usually crop within 3 years (UK nursery rootstock article). WVU Extension 'Pear Rootstocks': quince used in Europe, cold-sensitive in the US. Interstem needed for incompatible varieties. Size %, support (staking), spacing and full bearing: from memory (common UK practice). First crop 3-4 y: UK nursery pages ('usually within 3 years'; 'three to four years').",
  },
  {
    designation: 'Pyrodwarf',
    species: 'pear',
    vigour: 'semi-dwarf',
    sizePctOfSeedling: 50,
    needsSupport: false,
    inRowM: 2.7,
    betweenRowM: 3.6,
    yearsToFirstCrop: 2,
    yearsToFirstCropLate: 3,
    yearsToFullBearing: 5,
    yieldPerTreeKg: null,
    source:
      "Rootstock description quoted on a home-orchard society forum (secondary source): Pyrus communis, 'Old Home' x 'Bonne Louise', Geisenheim 1980; about 50 % of standard; very precocious, bearing in 2nd leaf; full bearing in 5 years; suggested spacing 9-12 ft in row, 12 ft between rows (lower figure used). needsSupport false: from memory. Yield: not found. First crop 2-3 y: ANFIC rootstock description ('fruit in 2-3 years').",
  },
  {
    designation: 'OHxF 333',
    species: 'pear',
    vigour: 'semi-dwarf',
    sizePctOfSeedling: 60,
    needsSupport: false,
    inRowM: 4.3,
    betweenRowM: 6.1,
    yearsToFirstCrop: 3,
    yearsToFirstCropLate: 4,
    yearsToFullBearing: 8,
    yieldPerTreeKg: 40,
    source:
      'Rootstock descriptions (secondary sources): 50-70 % of standard / about two-thirds of Bartlett seedling, well anchored, resistant to fire blight and pear decline, bears in 3-4 years, planting 14-18 ft in row and 20 ft between rows (lower figure used). Full bearing and yield: from memory (common practice).',
  },
  {
    designation: 'OHxF 87',
    species: 'pear',
    vigour: 'semi-vigorous',
    sizePctOfSeedling: 87,
    needsSupport: false,
    inRowM: 5.5,
    betweenRowM: 7.5,
    yearsToFirstCrop: 3,
    yearsToFirstCropLate: 4,
    yearsToFullBearing: 8,
    yieldPerTreeKg: 100,
    source:
      "WVU Extension, 'Pear Rootstocks': about 85-90 % of standard (midpoint used), the most precocious of the Old Home x Farmingdale selections. A free-standing tree that size wants near-standard room: Penn State Extension, 'Fruit Production for the Home Gardener', Table 4.3, spaces pear seedling trees 20 x 28 ft, here scaled to the tree's size (derived). First crop 3-4 y, full bearing and yield: from memory (common practice), the yield set so a hectare bears about what the pear seedling row's does.",
  },
  {
    designation: 'Pear seedling',
    species: 'pear',
    vigour: 'vigorous',
    sizePctOfSeedling: 100,
    needsSupport: false,
    inRowM: 7.0,
    betweenRowM: 9.0,
    yearsToFirstCrop: 7,
    yearsToFirstCropLate: 10,
    yearsToFullBearing: 15,
    yieldPerTreeKg: 150,
    source:
      "WVU Extension, 'Pear Rootstocks': Bartlett seedling is the industry standard, very vigorous large trees (100 %), winter hardy, variable in size. Traditional perry pear trees on seedling become very large and are slow to come into bearing (perry pear cultivar descriptions, e.g. Blakeney Red 'slow to come into bearing'). Spacing, first crop, full bearing and yield: from memory (traditional perry orchards). First crop 7-10 y: from memory.",
  },
]

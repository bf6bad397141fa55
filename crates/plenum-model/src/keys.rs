//! The one table of blocks and keys: what each key means, the value it takes,
//! its default and where that default comes from. The model checks files
//! against it; hover and completion read it.

use plenum_units::{Dimension, Measure};

/// The kinds of block.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum BlockKind {
    Project,
    Site,
    Zone,
    Ahu,
    Fan,
    Coil,
}

impl BlockKind {
    pub const TOP_LEVEL: [BlockKind; 4] = [
        BlockKind::Project,
        BlockKind::Site,
        BlockKind::Zone,
        BlockKind::Ahu,
    ];
    pub const ALL: [BlockKind; 6] = [
        BlockKind::Project,
        BlockKind::Site,
        BlockKind::Zone,
        BlockKind::Ahu,
        BlockKind::Fan,
        BlockKind::Coil,
    ];

    pub fn keyword(self) -> &'static str {
        match self {
            BlockKind::Project => "project",
            BlockKind::Site => "site",
            BlockKind::Zone => "zone",
            BlockKind::Ahu => "ahu",
            BlockKind::Fan => "fan",
            BlockKind::Coil => "coil",
        }
    }

    pub fn from_keyword(word: &str) -> Option<BlockKind> {
        BlockKind::ALL.into_iter().find(|k| k.keyword() == word)
    }

    /// The block that may hold this one (`None`: top level).
    pub fn parent(self) -> Option<BlockKind> {
        match self {
            BlockKind::Fan | BlockKind::Coil => Some(BlockKind::Ahu),
            _ => None,
        }
    }

    /// Blocks that carry a name (`zone NAME`, `ahu NAME`).
    pub fn is_named(self) -> bool {
        matches!(self, BlockKind::Zone | BlockKind::Ahu)
    }

    /// What the block describes, for hover and documentation.
    pub fn doc(self) -> &'static str {
        match self {
            BlockKind::Project => "The project: its name (the label) and its display units.",
            BlockKind::Site => {
                "The site: elevation or barometric pressure, and the outdoor design states."
            }
            BlockKind::Zone => {
                "A zone: a room or group of rooms with its peak loads from the load calculation."
            }
            BlockKind::Ahu => {
                "An air handler: the zones it serves, its supply air, fan, outdoor air and coil."
            }
            BlockKind::Fan => "The supply fan of an air handler: its heat and where it is added.",
            BlockKind::Coil => "The cooling coil of an air handler: leaving state and rating.",
        }
    }

    /// Nested block kinds allowed inside this one.
    pub fn children(self) -> &'static [BlockKind] {
        match self {
            BlockKind::Ahu => &[BlockKind::Fan, BlockKind::Coil],
            _ => &[],
        }
    }
}

/// Words a key may take.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Words(pub &'static [&'static str]);

/// The shape of value a key takes.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ValueKind {
    /// One quantity of this dimension (a temperature difference reads `3 °F` as one).
    Quantity(Dimension),
    /// A plain number or a count (`40`, `40 people`).
    Count,
    /// A fraction: `95 %` or `0.95`.
    Ratio,
    /// One of these words.
    Word(Words),
    /// An air state: a dry bulb and one humidity measure (`94 °F db, 75 °F wb`).
    AirState,
    /// A list of zone names.
    ZoneList,
    /// A ventilation category (the 62.1 table).
    Category,
    /// A temperature range (`44 °F to 56 °F`).
    TemperatureRange,
    /// `outdoor_air`: `ventilation`, an airflow, a percentage, a rate per person or per area.
    OutdoorAir,
    /// `return_duct`: a length, or `none`.
    LengthOrNone,
    /// `static`: a pressure `with efficiency RATIO`.
    StaticPressure,
    /// `ventilation_efficiency`: `simplified`, `calculated` or a ratio.
    VentilationEfficiency,
}

impl ValueKind {
    /// The value's expected form, in words (for messages and hover).
    pub fn describe(self) -> String {
        match self {
            ValueKind::Quantity(d) => dimension_words(d).to_string(),
            ValueKind::Count => "a number".to_string(),
            ValueKind::Ratio => "a percentage".to_string(),
            ValueKind::Word(w) => {
                let list: Vec<String> = w.0.iter().map(|s| format!("`{s}`")).collect();
                format!("one of {}", list.join(", "))
            }
            ValueKind::AirState => "an air state (a dry bulb and a humidity measure)".to_string(),
            ValueKind::ZoneList => "a list of zone names".to_string(),
            ValueKind::Category => "a ventilation category".to_string(),
            ValueKind::TemperatureRange => "a temperature range (`44 °F to 56 °F`)".to_string(),
            ValueKind::OutdoorAir => {
                "`ventilation`, an airflow, a percentage of supply, or a rate per person or per area"
                    .to_string()
            }
            ValueKind::LengthOrNone => "a length, or `none`".to_string(),
            ValueKind::StaticPressure => {
                "a pressure `with efficiency` a percentage".to_string()
            }
            ValueKind::VentilationEfficiency => {
                "`simplified`, `calculated` or a percentage".to_string()
            }
        }
    }
}

/// A dimension's name with its article, for messages ("a heat flow").
pub fn dimension_words(d: Dimension) -> String {
    let name = d
        .name()
        .map(str::to_string)
        .unwrap_or_else(|| format!("{d}"));
    let article = if name.starts_with(['a', 'e', 'i', 'o', 'u']) {
        "an"
    } else {
        "a"
    };
    format!("{article} {name}")
}

/// Where a default value comes from.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Source {
    /// A rule of thumb of the trade with no single published source.
    CommonPractice,
    /// ASHRAE Standard 62.1 (ventilation rate procedure).
    Ashrae621,
    /// A choice of this project, documented in methods.md.
    Project,
    /// No effect: the default is to leave something out.
    Neutral,
}

impl Source {
    pub fn describe(self) -> &'static str {
        match self {
            Source::CommonPractice => "common practice",
            Source::Ashrae621 => "ASHRAE 62.1",
            Source::Project => "a Plenum convention",
            Source::Neutral => "no effect",
        }
    }
}

/// One key of one block kind.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct KeyDef {
    pub block: BlockKind,
    pub name: &'static str,
    pub value: ValueKind,
    /// What the key means, in a sentence.
    pub doc: &'static str,
    /// The default, in words, when the key is not given (`None`: no default).
    pub default: Option<&'static str>,
    pub default_source: Option<Source>,
    /// The file must give this key.
    pub required: bool,
    /// Keys that say the same thing another way: give only one.
    pub alternatives: &'static [&'static str],
    /// Example value for completion snippets and documentation.
    pub example: &'static str,
}

const fn key(
    block: BlockKind,
    name: &'static str,
    value: ValueKind,
    doc: &'static str,
    example: &'static str,
) -> KeyDef {
    KeyDef {
        block,
        name,
        value,
        doc,
        default: None,
        default_source: None,
        required: false,
        alternatives: &[],
        example,
    }
}

impl KeyDef {
    /// How a value of this key is displayed (hover, reports): the trade's
    /// measure for what the key means, not only for its dimension (a rated
    /// capacity in tons, a zone load in Btu/h, a fan's static pressure in in.wg).
    pub fn measure(&self) -> Option<Measure> {
        match (self.block, self.name) {
            (_, "rated" | "rated_sensible") => Some(Measure::Capacity),
            (BlockKind::Zone, "sensible" | "latent") | (BlockKind::Ahu, "plenum_gain") => {
                Some(Measure::Load)
            }
            (BlockKind::Fan, "static") => Some(Measure::StaticPressure),
            (BlockKind::Fan, "power") => Some(Measure::Power),
            (BlockKind::Site, "pressure") => Some(Measure::Pressure),
            _ => match self.value {
                ValueKind::Quantity(d) => Measure::for_dimension(d),
                ValueKind::Ratio => Some(Measure::Percent),
                ValueKind::Count => Some(Measure::Count),
                _ => None,
            },
        }
    }

    const fn default(mut self, text: &'static str, source: Source) -> KeyDef {
        self.default = Some(text);
        self.default_source = Some(source);
        self
    }
    const fn required(mut self) -> KeyDef {
        self.required = true;
        self
    }
    const fn or(mut self, alternatives: &'static [&'static str]) -> KeyDef {
        self.alternatives = alternatives;
        self
    }
}

use BlockKind as B;
use ValueKind as V;

const UNITS_WORDS: Words = Words(&["ip", "si"]);
const MOTOR_WORDS: Words = Words(&["in_airstream", "outside"]);
const ARRANGEMENT_WORDS: Words = Words(&["draw_through", "blow_through"]);

/// Every key of every block.
pub static KEYS: &[KeyDef] = &[
    // project
    key(B::Project, "units", V::Word(UNITS_WORDS), "Display units of reports and hovers; inputs may mix IP and SI.", "ip")
        .default("ip", Source::Neutral),
    // site
    key(B::Site, "elevation", V::Quantity(Dimension::LENGTH), "Site elevation above sea level; gives the barometric pressure by the standard atmosphere (ASHRAE Handbook—Fundamentals ch. 1).", "1_250 ft")
        .default("0 ft (sea level)", Source::Neutral)
        .or(&["pressure"]),
    key(B::Site, "pressure", V::Quantity(Dimension::PRESSURE), "Barometric pressure at the site, given directly instead of the elevation.", "14.05 psia")
        .or(&["elevation"]),
    key(B::Site, "cooling", V::AirState, "Cooling design outdoor state: a dry bulb with its coincident wet bulb (or dew point, RH or humidity ratio). There is no default outdoor condition.", "94 °F db, 75 °F wb")
        .required(),
    key(B::Site, "dehumid", V::AirState, "Dehumidification design outdoor state (a dew point with its mean coincident dry bulb); when given, every coil is also evaluated at it and the larger total load governs.", "71 °F dp, 82 °F db"),
    // zone
    key(B::Zone, "area", V::Quantity(Dimension::AREA), "Floor area of the zone, for the 62.1 area rate.", "2_400 ft²")
        .default("none (no area-based outdoor air)", Source::Neutral),
    key(B::Zone, "people", V::Count, "Design occupants of the zone, for the 62.1 people rate.", "40")
        .default("0", Source::Neutral),
    key(B::Zone, "use", V::Category, "Ventilation category of the zone (the occupancy category of the ASHRAE 62.1 table).", "office"),
    key(B::Zone, "indoor", V::AirState, "Indoor design state of the zone.", "75 °F, 50 %rh")
        .default("75 °F, 50 %rh", Source::CommonPractice),
    key(B::Zone, "sensible", V::Quantity(Dimension::HEAT_FLOW), "Peak sensible heat gain of the zone, from the load calculation.", "38.5 kBtu/h")
        .required(),
    key(B::Zone, "latent", V::Quantity(Dimension::HEAT_FLOW), "Peak latent heat gain of the zone, from the load calculation.", "8.2 kBtu/h")
        .default("0 Btu/h", Source::Neutral),
    key(B::Zone, "distribution_effectiveness", V::Ratio, "Zone air distribution effectiveness E_z of ASHRAE 62.1.", "100 %")
        .default("100 % (ceiling supply of cool air)", Source::Ashrae621),
    // ahu
    key(B::Ahu, "serves", V::ZoneList, "The zones this air handler serves.", "reading, stacks")
        .required(),
    key(B::Ahu, "supply_temp", V::Quantity(Dimension::TEMPERATURE), "Supply air temperature at the diffusers.", "55 °F")
        .default("the lowest indoor temperature of the served zones − 18 °F", Source::CommonPractice)
        .or(&["supply_dt"]),
    key(B::Ahu, "supply_dt", V::Quantity(Dimension::TEMPERATURE_DIFFERENCE), "Supply air this far below the lowest indoor temperature of the served zones.", "18 °F")
        .or(&["supply_temp"]),
    key(B::Ahu, "diversity", V::Ratio, "Diversity applied to the sum of the served zones' peak loads (the block load).", "95 %")
        .default("100 %", Source::Neutral),
    key(B::Ahu, "supply_duct", V::Quantity(Dimension::LENGTH), "Length of the supply duct run, for its heat gain at 1.5 °F per 100 ft.", "180 ft")
        .default("a 3 °F rise", Source::CommonPractice)
        .or(&["supply_duct_rise"]),
    key(B::Ahu, "supply_duct_rise", V::Quantity(Dimension::TEMPERATURE_DIFFERENCE), "Temperature rise of the supply air in its duct, given directly.", "2 °F")
        .or(&["supply_duct"]),
    key(B::Ahu, "return_duct", V::LengthOrNone, "Length of the return duct run, for its heat gain at 1.0 °F per 100 ft; `none` for a return without a duct.", "60 ft")
        .default("a 3 °F rise", Source::CommonPractice)
        .or(&["return_duct_rise"]),
    key(B::Ahu, "return_duct_rise", V::Quantity(Dimension::TEMPERATURE_DIFFERENCE), "Temperature rise of the return air in its duct, given directly.", "1 °F")
        .or(&["return_duct"]),
    key(B::Ahu, "plenum_gain", V::Quantity(Dimension::HEAT_FLOW), "Heat picked up by the return air in a ceiling plenum (lighting, roof).", "4.1 kBtu/h")
        .default("0 Btu/h", Source::Neutral),
    key(B::Ahu, "outdoor_air", V::OutdoorAir, "Outdoor air: `ventilation` (the ASHRAE 62.1 ventilation rate procedure), an airflow at the outdoor state, a percentage of the supply mass flow, a rate per person or per area, or `100 %` for a dedicated outdoor-air unit.", "ventilation")
        .default("ventilation (the 62.1 minimum)", Source::Ashrae621),
    key(B::Ahu, "occupant_diversity", V::Ratio, "Occupant diversity D of the 62.1 multiple-zone procedure.", "100 %")
        .default("100 %", Source::Ashrae621),
    key(B::Ahu, "ventilation_efficiency", V::VentilationEfficiency, "System ventilation efficiency E_v of 62.1: the `simplified` procedure, the `calculated` one, or a given value.", "simplified")
        .default("simplified", Source::Ashrae621),
    key(B::Ahu, "outdoor_fan_rise", V::Quantity(Dimension::TEMPERATURE_DIFFERENCE), "Temperature rise of the outdoor air from a separate outdoor-air fan.", "1.5 °F")
        .default("0 °F", Source::Neutral),
    // fan
    key(B::Fan, "power", V::Quantity(Dimension::POWER), "Fan shaft power.", "7.5 hp")
        .or(&["static", "rise"]),
    key(B::Fan, "static", V::StaticPressure, "Total static pressure with the fan's efficiency; shaft power is cfm·Δp / (6356·η) (common practice).", "2.5 in.wg with efficiency 62 %")
        .or(&["power", "rise"]),
    key(B::Fan, "rise", V::Quantity(Dimension::TEMPERATURE_DIFFERENCE), "Temperature rise across the fan, given directly.", "2 °F")
        .or(&["power", "static"]),
    key(B::Fan, "motor_efficiency", V::Ratio, "Motor efficiency; with the motor in the air stream its losses heat the air too.", "91 %")
        .default("90 % when the motor is in the air stream", Source::CommonPractice),
    key(B::Fan, "motor", V::Word(MOTOR_WORDS), "Where the motor is: `in_airstream` (its losses heat the air) or `outside`.", "in_airstream")
        .default("in_airstream", Source::CommonPractice),
    key(B::Fan, "arrangement", V::Word(ARRANGEMENT_WORDS), "`draw_through`: the fan heat is added between coil and supply; `blow_through`: to the mixed air before the coil.", "draw_through")
        .default("draw_through", Source::CommonPractice),
    // coil
    key(B::Coil, "leaving_rh", V::Ratio, "Relative humidity of the air leaving the coil.", "95 %")
        .default("95 %", Source::CommonPractice),
    key(B::Coil, "rated", V::Quantity(Dimension::HEAT_FLOW), "Rated (selected) total capacity of the coil: the undersize check compares it with the required load.", "12.5 ton"),
    key(B::Coil, "rated_sensible", V::Quantity(Dimension::HEAT_FLOW), "Rated sensible capacity of the coil.", "9.6 ton"),
    key(B::Coil, "chilled_water", V::TemperatureRange, "Chilled water supply and return temperatures, for the water flow (gpm = load / (500·Δt), common practice).", "44 °F to 56 °F"),
    key(B::Coil, "face_area", V::Quantity(Dimension::AREA), "Face area of the coil, for the face velocity check (at most 500 fpm, common practice).", "20 ft²"),
];

/// The keys of one block kind, in table order.
pub fn keys_of(block: BlockKind) -> impl Iterator<Item = &'static KeyDef> {
    KEYS.iter().filter(move |k| k.block == block)
}

/// One key's definition.
pub fn key_def(block: BlockKind, name: &str) -> Option<&'static KeyDef> {
    KEYS.iter().find(|k| k.block == block && k.name == name)
}

/// The closest of `candidates` to `word` by edit distance, when close enough
/// to be a likely misspelling.
pub fn nearest<'a>(word: &str, candidates: impl IntoIterator<Item = &'a str>) -> Option<&'a str> {
    let mut best: Option<(&str, usize)> = None;
    for c in candidates {
        let d = edit_distance(&word.to_lowercase(), &c.to_lowercase());
        if best.is_none_or(|(_, bd)| d < bd) {
            best = Some((c, d));
        }
    }
    let limit = (word.chars().count() / 3).max(1) + 1;
    best.filter(|(_, d)| *d <= limit).map(|(c, _)| c)
}

/// Levenshtein distance over characters (with adjacent transpositions counted once).
pub fn edit_distance(a: &str, b: &str) -> usize {
    let a: Vec<char> = a.chars().collect();
    let b: Vec<char> = b.chars().collect();
    let mut prev2: Vec<usize> = vec![0; b.len() + 1];
    let mut prev: Vec<usize> = (0..=b.len()).collect();
    for i in 1..=a.len() {
        let mut cur = vec![i; b.len() + 1];
        for j in 1..=b.len() {
            let cost = usize::from(a[i - 1] != b[j - 1]);
            cur[j] = (prev[j] + 1).min(cur[j - 1] + 1).min(prev[j - 1] + cost);
            if i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1] {
                cur[j] = cur[j].min(prev2[j - 2] + 1);
            }
        }
        prev2 = std::mem::replace(&mut prev, cur);
    }
    prev[b.len()]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_key_of_language_md_is_in_the_table() {
        // The fixed core of the format (language.md) — keep these spellings.
        let core = [
            (B::Project, "units"),
            (B::Site, "elevation"),
            (B::Site, "pressure"),
            (B::Site, "cooling"),
            (B::Site, "dehumid"),
            (B::Zone, "area"),
            (B::Zone, "people"),
            (B::Zone, "use"),
            (B::Zone, "indoor"),
            (B::Zone, "sensible"),
            (B::Zone, "latent"),
            (B::Ahu, "serves"),
            (B::Ahu, "supply_temp"),
            (B::Ahu, "supply_dt"),
            (B::Ahu, "diversity"),
            (B::Ahu, "supply_duct"),
            (B::Ahu, "supply_duct_rise"),
            (B::Ahu, "return_duct"),
            (B::Ahu, "return_duct_rise"),
            (B::Ahu, "plenum_gain"),
            (B::Ahu, "outdoor_air"),
            (B::Fan, "power"),
            (B::Fan, "static"),
            (B::Fan, "motor_efficiency"),
            (B::Fan, "motor"),
            (B::Fan, "arrangement"),
            (B::Coil, "leaving_rh"),
            (B::Coil, "rated"),
            (B::Coil, "rated_sensible"),
            (B::Coil, "chilled_water"),
        ];
        for (block, name) in core {
            assert!(key_def(block, name).is_some(), "{block:?}.{name}");
        }
    }

    #[test]
    fn keys_are_unique_and_alternatives_point_at_real_keys() {
        for (i, k) in KEYS.iter().enumerate() {
            assert!(
                KEYS[..i]
                    .iter()
                    .all(|o| o.block != k.block || o.name != k.name),
                "duplicate {}",
                k.name
            );
            for alt in k.alternatives {
                let other = key_def(k.block, alt).expect("alternative exists");
                assert!(other.alternatives.contains(&k.name), "{} <-> {alt}", k.name);
            }
            assert!(!k.doc.is_empty());
            assert_eq!(k.default.is_some(), k.default_source.is_some());
        }
    }

    #[test]
    fn every_quantity_key_has_a_display_measure_of_its_dimension() {
        for k in KEYS {
            if let ValueKind::Quantity(d) = k.value {
                let m = k
                    .measure()
                    .unwrap_or_else(|| panic!("{} has no measure", k.name));
                assert_eq!(m.dimension(), d, "{}", k.name);
            }
        }
        assert_eq!(
            key_def(B::Coil, "rated").and_then(KeyDef::measure),
            Some(Measure::Capacity)
        );
    }

    #[test]
    fn misspellings_find_their_key() {
        let names = keys_of(B::Ahu).map(|k| k.name);
        assert_eq!(nearest("suply_temp", names), Some("supply_temp"));
        assert_eq!(
            nearest("serve", keys_of(B::Ahu).map(|k| k.name)),
            Some("serves")
        );
        assert_eq!(nearest("xyzzy", keys_of(B::Ahu).map(|k| k.name)), None);
        assert_eq!(edit_distance("ab", "ba"), 1);
    }
}

//! Numbers for people: display unit systems and rounding. The engine computes in SI;
//! conversion happens only where numbers are shown (the drawings' scenes, the app's
//! fields and tables), through this module.

/// A unit system for display and entry.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Units {
    /// m, kN, kNm, kN/m2, E in GPa.
    #[default]
    Si,
    /// ft, kip, kip·ft, psf (area loads), kip/ft (line loads), in (section depths), ksi.
    UsCustomary,
}

impl Units {
    /// The short key of the system in links and browser storage: `si` or `us`.
    pub fn key(self) -> &'static str {
        match self {
            Units::Si => "si",
            Units::UsCustomary => "us",
        }
    }

    /// The system of a key written by [`Units::key`]; `None` for any other text (a
    /// caller keeps its own choice then).
    pub fn from_key(key: &str) -> Option<Units> {
        match key {
            "si" => Some(Units::Si),
            "us" => Some(Units::UsCustomary),
            _ => None,
        }
    }

    /// The other system (the header's switch).
    pub fn other(self) -> Units {
        match self {
            Units::Si => Units::UsCustomary,
            Units::UsCustomary => Units::Si,
        }
    }
}

/// Kinds of quantity shown on screen.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Quantity {
    /// m / ft.
    Length,
    /// kN / kip.
    Force,
    /// kNm / kip·ft.
    Moment,
    /// kN/m2 / psf (area loads: dead load, surfacing, live load over the deck).
    Pressure,
    /// kN/m / kip/ft (line loads: a load per metre of deck, the whole width).
    LineLoad,
    /// m / in (section depths, the thrust line's offsets from the rib axis).
    SectionDepth,
    /// kN/m2 (E) shown as GPa / ksi.
    Modulus,
    /// m2 / in2.
    Area,
    /// m4 / in4.
    Inertia,
    /// kN/m3 / pcf.
    UnitWeight,
    /// Plain number.
    Count,
    /// Degrees.
    Angle,
    /// m3 / yd3 (material volumes).
    Volume,
    /// t (tonnes, 1000 kg) / US tons (2000 lb): material masses.
    Mass,
    /// A ratio shown as a plain number (utilisation: demand over resistance).
    Ratio,
}

/// 1 kip = 4.4482216152605 kN (exact by definition of the pound-force and the pound).
pub const KN_PER_KIP: f64 = 4.448_221_615_260_5;
/// 1 ft = 0.3048 m (exact).
pub const M_PER_FT: f64 = 0.3048;
/// 1 lb = 0.45359237 kg (exact).
pub const KG_PER_LB: f64 = 0.453_592_37;
/// 1 in = 0.0254 m (exact).
pub const M_PER_IN: f64 = 0.0254;
/// 1 kip = 1000 lbf: psf (lbf/ft2) per ksf (kip/ft2).
const LBF_PER_KIP: f64 = 1000.0;

impl Quantity {
    /// A short name for data attributes ("force", "length", ...).
    pub fn key(self) -> &'static str {
        match self {
            Quantity::Length => "length",
            Quantity::Force => "force",
            Quantity::Moment => "moment",
            Quantity::Pressure => "pressure",
            Quantity::LineLoad => "line-load",
            Quantity::SectionDepth => "section-depth",
            Quantity::Modulus => "modulus",
            Quantity::Area => "area",
            Quantity::Inertia => "inertia",
            Quantity::UnitWeight => "unit-weight",
            Quantity::Count => "count",
            Quantity::Angle => "angle",
            Quantity::Volume => "volume",
            Quantity::Mass => "mass",
            Quantity::Ratio => "ratio",
        }
    }
}

impl Units {
    /// (factor from SI, unit label): shown value = SI value * factor.
    pub fn of(self, q: Quantity) -> (f64, &'static str) {
        match (self, q) {
            (Units::Si, Quantity::Length) => (1.0, "m"),
            (Units::Si, Quantity::Force) => (1.0, "kN"),
            (Units::Si, Quantity::Moment) => (1.0, "kNm"),
            (Units::Si, Quantity::Pressure) => (1.0, "kN/m²"),
            (Units::Si, Quantity::LineLoad) => (1.0, "kN/m"),
            (Units::Si, Quantity::SectionDepth) => (1.0, "m"),
            (Units::Si, Quantity::Modulus) => (1e-6, "GPa"),
            (Units::Si, Quantity::Area) => (1.0, "m²"),
            (Units::Si, Quantity::Inertia) => (1.0, "m⁴"),
            (Units::Si, Quantity::UnitWeight) => (1.0, "kN/m³"),
            (Units::UsCustomary, Quantity::Length) => (1.0 / M_PER_FT, "ft"),
            (Units::UsCustomary, Quantity::Force) => (1.0 / KN_PER_KIP, "kip"),
            (Units::UsCustomary, Quantity::Moment) => (1.0 / (KN_PER_KIP * M_PER_FT), "kip·ft"),
            (Units::UsCustomary, Quantity::Pressure) => {
                (M_PER_FT * M_PER_FT / KN_PER_KIP * LBF_PER_KIP, "psf")
            }
            (Units::UsCustomary, Quantity::LineLoad) => (M_PER_FT / KN_PER_KIP, "kip/ft"),
            (Units::UsCustomary, Quantity::SectionDepth) => (1.0 / M_PER_IN, "in"),
            (Units::UsCustomary, Quantity::Modulus) => ((M_PER_IN * M_PER_IN) / KN_PER_KIP, "ksi"),
            (Units::UsCustomary, Quantity::Area) => (1.0 / (M_PER_IN * M_PER_IN), "in²"),
            (Units::UsCustomary, Quantity::Inertia) => (1.0 / M_PER_IN.powi(4), "in⁴"),
            (Units::UsCustomary, Quantity::UnitWeight) => (M_PER_FT.powi(3) / KN_PER_KIP * 1000.0, "pcf"),
            (Units::Si, Quantity::Volume) => (1.0, "m³"),
            (Units::Si, Quantity::Mass) => (1.0, "t"),
            (Units::UsCustomary, Quantity::Volume) => (1.0 / (3.0 * M_PER_FT).powi(3), "yd³"),
            (Units::UsCustomary, Quantity::Mass) => (1.0 / (2000.0 * KG_PER_LB / 1000.0), "ton"),
            (_, Quantity::Count | Quantity::Ratio) => (1.0, ""),
            (_, Quantity::Angle) => (1.0, "°"),
        }
    }
    /// The SI value shown as a number in this system.
    pub fn to_shown(self, q: Quantity, si: f64) -> f64 {
        si * self.of(q).0
    }
    /// A number typed in this system, back to SI.
    pub fn to_si(self, q: Quantity, shown: f64) -> f64 {
        shown / self.of(q).0
    }
    /// Unit label.
    pub fn label(self, q: Quantity) -> &'static str {
        self.of(q).1
    }
    /// The value with its unit, rounded for reading: `12 345 kN`, `97.50 m`.
    pub fn show(self, q: Quantity, si: f64) -> String {
        let v = self.to_shown(q, si);
        let unit = self.label(q);
        let n = round_for_display(v);
        if unit.is_empty() {
            n
        } else if unit == "°" {
            format!("{n}°")
        } else {
            format!("{n}\u{a0}{unit}")
        }
    }
}

/// Four significant figures, at most three decimals, digit groups of three separated by
/// a thin space; "0" for exact zero; "−" (minus sign) for negatives; magnitudes below 1e-3
/// (small areas and second moments) in scientific notation with four figures
/// ("1.000e−10"); "—" for a value that is not finite.
pub fn round_for_display(v: f64) -> String {
    if !v.is_finite() {
        return "—".into();
    }
    if v == 0.0 {
        return "0".into();
    }
    if v.abs() < 1e-3 {
        // small areas and second moments: four figures in scientific notation
        return format!("{v:.3e}").replace('-', "−");
    }
    let mag = v.abs().log10().floor() as i32;
    let decimals = (3 - mag).clamp(0, 3) as usize;
    let s = format!("{:.*}", decimals, v.abs());
    let (int, frac) = match s.split_once('.') {
        Some((i, f)) => (i.to_string(), Some(f.to_string())),
        None => (s.clone(), None),
    };
    let mut grouped = String::new();
    for (k, c) in int.chars().enumerate() {
        if k > 0 && (int.len() - k) % 3 == 0 {
            grouped.push('\u{2009}');
        }
        grouped.push(c);
    }
    let sign = if v < 0.0 && s.chars().any(|c| c.is_ascii_digit() && c != '0') { "−" } else { "" };
    match frac {
        Some(f) => format!("{sign}{grouped}.{f}"),
        None => format!("{sign}{grouped}"),
    }
}

/// Parses a number shown by `round_for_display`.
/// Used by tests.
#[cfg(test)]
fn parse_display(text: &str) -> Option<f64> {
    let t: String = text.chars().filter(|c| !matches!(c, '\u{2009}' | '\u{a0}' | ' ')).collect();
    t.replace('−', "-").parse().ok()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn display_rounding_keeps_four_figures_and_groups_digits() {
        assert_eq!(round_for_display(12345.678), "12\u{2009}346");
        assert_eq!(round_for_display(97.5), "97.50");
        assert_eq!(round_for_display(-0.012345), "−0.012");
        assert_eq!(parse_display(&round_for_display(-4321.4)), Some(-4321.0));
        assert_eq!(round_for_display(1e-10), "1.000e−10");
    }

    /// Every US customary factor against its defined value, typed here as a number (never
    /// computed from the constants under test). The foot (0.3048 m) and the inch
    /// (0.0254 m) are exact; the pound-force is exact from the international pound
    /// (0.453 592 37 kg) and standard gravity (9.806 65 m/s2): 1 lbf = 4.448 221 615 260 5 N
    /// (NIST SP 811, 2008 ed., Appendix B). The longer decimals below are these exact
    /// values multiplied or divided out. A wrong constant (4.0 kN per kip, say) fails
    /// the first row.
    #[test]
    fn us_customary_factors_match_definitions() {
        // (quantity, SI value of one US unit, its label): kip = 1000 lbf in kN; ft exact;
        // kip-ft = kip x ft in kNm (exact); psf = lbf / ft2 and ksi = kip / in2 in kN/m2;
        // kip/ft in kN/m; in exact;
        // in2 and in4 exact; pcf = lbf / ft3 in kN/m3. Relative tolerance 1e-14: the values
        // are exact or carry 16 significant digits, a few ulps of f64.
        let defined = [
            (Quantity::Force, 4.448_221_615_260_5, "kip"),
            (Quantity::Length, 0.3048, "ft"),
            (Quantity::Moment, 1.355_817_948_331_400_4, "kip·ft"),
            (Quantity::Pressure, 0.047_880_258_980_335_84, "psf"),
            (Quantity::LineLoad, 14.593_902_937_206_365, "kip/ft"),
            (Quantity::SectionDepth, 0.0254, "in"),
            (Quantity::Modulus, 6_894.757_293_168_361, "ksi"),
            (Quantity::Area, 6.4516e-4, "in²"),
            (Quantity::Inertia, 4.162_314_256e-7, "in⁴"),
            (Quantity::UnitWeight, 0.157_087_463_846_246_2, "pcf"),
            // 1 yd3 = 0.764 554 857 984 m3, 1 US ton = 907.184 74 kg (NIST SP 811, Appendix B)
            (Quantity::Volume, 0.764_554_857_984, "yd³"),
            (Quantity::Mass, 0.907_184_74, "ton"),
        ];
        for (q, si, label) in defined {
            let shown = Units::UsCustomary.to_shown(q, si);
            assert!((shown - 1.0).abs() < 1e-14, "{label}: one {label} is {si} SI but shows as {shown}");
            let back = Units::UsCustomary.to_si(q, 1.0);
            assert!((back - si).abs() < 1e-14 * si, "{label}: 1 {label} goes back to {back}, not {si}");
            assert_eq!(Units::UsCustomary.label(q), label);
        }
        // the named constants themselves, against the definitions they stand for
        assert!((KN_PER_KIP - 0.453_592_37 * 9.806_65).abs() < 1e-15 * KN_PER_KIP);
        assert_eq!(M_PER_FT, 0.3048);
        assert_eq!(M_PER_IN, 0.0254);
        // SI shows as it is, E in GPa: 210e6 kN/m2 = 210 GPa
        assert_eq!(Units::Si.to_shown(Quantity::Force, 123.4), 123.4);
        assert!((Units::Si.to_shown(Quantity::Modulus, 210e6) - 210.0).abs() < 1e-12);
        assert_eq!(Units::Si.label(Quantity::LineLoad), "kN/m");
        assert_eq!(Units::Si.to_shown(Quantity::SectionDepth, 1.8), 1.8);
    }

    /// The demo's 5.0 kN/m2 of surfacing-like area load reads in psf as a US engineer
    /// writes it (about 104.4 psf: 5.0 / 0.047 880 258 98), not as 0.104 ksf; a 1.8 m rib
    /// depth is 70.87 in (1.8 / 0.0254).
    #[test]
    fn us_area_loads_read_in_psf_and_depths_in_inches() {
        assert_eq!(Units::UsCustomary.show(Quantity::Pressure, 5.0), "104.4\u{a0}psf");
        assert_eq!(Units::UsCustomary.show(Quantity::SectionDepth, 1.8), "70.87\u{a0}in");
        assert_eq!(Units::UsCustomary.show(Quantity::LineLoad, 55.0), "3.769\u{a0}kip/ft");
    }

    #[test]
    fn unit_keys_round_trip_and_refuse_other_text() {
        for u in [Units::Si, Units::UsCustomary] {
            assert_eq!(Units::from_key(u.key()), Some(u));
            assert_ne!(u.other(), u);
            assert_eq!(u.other().other(), u);
        }
        assert_eq!(Units::from_key("US"), None);
        assert_eq!(Units::from_key(""), None);
    }
}

//! Values of an `eye` block that compare it with other eye blocks: anisometropia
//! against the other eye of the same visit, and the change of the refraction since
//! the previous dated visit of the same eye, as power vectors and per year.

use super::keys;
use crate::blocks::Context;
use crate::codes;
use crate::compute::{n4, Out};
use crate::derived::{DerivedValue as V, Method};
use crate::diagnostic::{Diagnostic, Severity};
use crate::model::{Block, Case, Eye, Side};
use crate::sources as src;
use parax_optics::refraction::SphCyl;
use std::collections::HashMap;

fn rx(e: &Eye) -> Option<SphCyl> {
    e.refraction
        .as_ref()
        .map(|r| SphCyl::new(r.value.rx.sphere, r.value.rx.cylinder, r.value.rx.axis))
}

/// Days since 1970-01-01 of a `YYYY-MM-DD` date (Howard Hinnant's days-from-civil
/// algorithm; a dozen lines of arithmetic do not justify a date crate).
fn days(date: &str) -> Option<i64> {
    let mut it = date.split('-').map(|p| p.parse::<i64>().ok());
    let (y, m, d) = (it.next()??, it.next()??, it.next()??);
    let y = if m <= 2 { y - 1 } else { y };
    let era = y.div_euclid(400);
    let yoe = y - era * 400;
    let mp = (m + 9) % 12;
    let doy = (153 * mp + 2) / 5 + d - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    Some(era * 146097 + doe - 719468)
}

/// Look-ups over every eye block of a case, built once per evaluation so that
/// each eye block finds its partner and its previous visit without scanning all
/// the others (which was quadratic in the number of eye blocks).
pub struct Visits<'a> {
    /// First eye block with a refraction for each (side, date).
    first: HashMap<(Side, Option<&'a str>), usize>,
    /// Per side, (day number, index) of each dated eye block with a refraction,
    /// sorted; ties keep file order.
    dated: HashMap<Side, Vec<(i64, usize)>>,
}

impl<'a> Visits<'a> {
    /// Index the eye blocks of `case`.
    pub fn new(case: &'a Case) -> Self {
        Self::of(case, 0..case.blocks.len())
    }

    /// Index only the eye blocks `eyes` (indices in `case.blocks`, ascending). An
    /// eye indexed together with its partner and previous visit finds the same
    /// ones as through [`Visits::new`] (the incremental evaluation uses this to
    /// compute one eye again without indexing every visit).
    pub fn of(case: &'a Case, eyes: impl IntoIterator<Item = usize>) -> Self {
        let mut first = HashMap::new();
        let mut dated: HashMap<Side, Vec<(i64, usize)>> = HashMap::new();
        for i in eyes {
            let Block::Eye(o) = &case.blocks[i] else {
                continue;
            };
            if o.refraction.is_none() {
                continue;
            }
            first.entry((o.side, o.date.as_deref())).or_insert(i);
            if let Some(d) = o.date.as_deref().and_then(days) {
                dated.entry(o.side).or_default().push((d, i));
            }
        }
        for v in dated.values_mut() {
            v.sort_unstable();
        }
        Visits { first, dated }
    }

    /// Index in `case.blocks` of the other eye of the same visit, if any.
    pub fn partner(&self, e: &Eye) -> Option<usize> {
        e.refraction.as_ref()?;
        let other_side = match e.side {
            Side::Right => Side::Left,
            Side::Left => Side::Right,
        };
        self.first.get(&(other_side, e.date.as_deref())).copied()
    }

    /// Index in `case.blocks` of the previous dated visit of the same eye, if any.
    pub fn previous(&self, e: &Eye) -> Option<usize> {
        e.refraction.as_ref()?;
        let now = e.date.as_deref().and_then(days)?;
        let v = self.dated.get(&e.side)?;
        let k = v.partition_point(|&(d, _)| d < now);
        k.checked_sub(1).map(|k| v[k].1)
    }
}

pub(crate) fn compute(
    case: &Context<'_>,
    visits: &Visits<'_>,
    e: &Eye,
    out: &mut Out<'_>,
    diags: &mut Vec<Diagnostic>,
) {
    let Some(this) = rx(e) else { return };
    let span = e.refraction.as_ref().map_or(e.span, |r| r.span);
    // Anisometropia: the other eye of the same visit (same date, or both undated).
    if let Some(other) = visits.partner(e).map(|i| case.eye(i)) {
        let o = rx(other).expect("checked");
        let (r, l) = if e.side == Side::Right {
            (this, o)
        } else {
            (o, this)
        };
        let se = (r.spherical_equivalent() - l.spherical_equivalent()).abs();
        out.push(
            keys::ANISOMETROPIA,
            "anisometropia in spherical equivalent",
            V::Power { dioptres: se },
            span,
            &Method {
                formula: "|M_right − M_left|",
                source: src::THIBOS_1997,
            },
            || {
                format!(
                    "|{} − {}| = {}",
                    n4(r.spherical_equivalent()),
                    n4(l.spherical_equivalent()),
                    n4(se)
                )
            },
        );
        let mut worst: f64 = se;
        for (mer, name, label) in [
            (
                180.0,
                keys::ANISOMETROPIA_180,
                "anisometropia in meridian 180",
            ),
            (90.0, keys::ANISOMETROPIA_90, "anisometropia in meridian 90"),
        ] {
            let d = (r.meridian_power(mer) - l.meridian_power(mer)).abs();
            worst = worst.max(d);
            out.push(
                name,
                label,
                V::Power { dioptres: d },
                span,
                &Method {
                    formula: "|F_right(φ) − F_left(φ)|, F(φ) = S + C·sin²(φ − θ)",
                    source: src::POWER_MATRIX,
                },
                || {
                    format!(
                        "|{} − {}| = {}",
                        n4(r.meridian_power(mer)),
                        n4(l.meridian_power(mer)),
                        n4(d)
                    )
                },
            );
        }
        if e.side == Side::Right && worst >= 2.0 - 1e-9 {
            diags.push(
                Diagnostic::new(
                    codes::ANISOMETROPIA,
                    Severity::Info,
                    span,
                    format!("the eyes differ by up to {worst:.2} D"),
                )
                .hint("see the prism imbalance at the reading point and the aniseikonia estimate of the spectacle lenses")
                .caution(crate::diagnostic::GENERAL_CAUTION),
            );
        }
    }
    // Change since the previous dated visit of the same eye.
    let Some(now) = e.date.as_deref().and_then(days) else {
        return;
    };
    // The latest earlier visit; among visits of the same day, the last in the file.
    let prev = visits.previous(e).map(|i| {
        let o = case.eye(i);
        (o.date.as_deref().and_then(days).expect("dated"), o)
    });
    let Some((then, before)) = prev else { return };
    let b = rx(before).expect("checked");
    let change = this.power_vector().sub(&b.power_vector());
    let years = (now - then) as f64 / 365.25;
    let since = before.date.clone().unwrap_or_default();
    for (name, label, v) in [
        (
            keys::CHANGE_M,
            "change of M since the previous visit",
            change.m,
        ),
        (
            keys::CHANGE_J0,
            "change of J0 since the previous visit",
            change.j0,
        ),
        (
            keys::CHANGE_J45,
            "change of J45 since the previous visit",
            change.j45,
        ),
    ] {
        out.push(
            name,
            label,
            V::Power { dioptres: v },
            span,
            &Method {
                formula: "power vector now − power vector at the previous visit",
                source: src::THIBOS_1997,
            },
            || {
                format!(
                    "{} → {}: {}",
                    since,
                    e.date.clone().unwrap_or_default(),
                    n4(v)
                )
            },
        );
    }
    out.push(
        keys::CHANGE_YEARS,
        "years since the previous visit",
        V::Number { value: years },
        span,
        &Method {
            formula: "days / 365.25",
            source: src::THIBOS_1997,
        },
        || format!("{} days / 365.25 = {}", now - then, n4(years)),
    );
    let per_year = change.m / years;
    out.push(
        keys::CHANGE_M_PER_YEAR,
        "change of M per year",
        V::Power { dioptres: per_year },
        span,
        &Method {
            formula: "ΔM / years",
            source: src::THIBOS_1997,
        },
        || format!("{} / {} = {}", n4(change.m), n4(years), n4(per_year)),
    );
    let blur_per_year = change.blur_strength() / years;
    out.push(
        keys::CHANGE_BLUR_PER_YEAR,
        "blur strength of the change per year",
        V::Power {
            dioptres: blur_per_year,
        },
        span,
        &Method {
            formula: "√(ΔM² + ΔJ0² + ΔJ45²) / years",
            source: src::THIBOS_1997,
        },
        || {
            format!(
                "{} / {} = {}",
                n4(change.blur_strength()),
                n4(years),
                n4(blur_per_year)
            )
        },
    );
    if blur_per_year >= 0.5 - 1e-9 {
        diags.push(
            Diagnostic::new(
                codes::REFRACTION_CHANGE,
                Severity::Info,
                span,
                format!(
                    "refraction changed by {:.2} D per year (blur strength) since {since}",
                    blur_per_year
                ),
            )
            .hint("a change this fast deserves a clinical explanation (progression, lens changes, ocular disease)")
            .caution(crate::diagnostic::GENERAL_CAUTION),
        );
    }
}

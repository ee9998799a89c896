//! The `acuity` keyword's value: visual acuity recorded as a Snellen fraction
//! (test distance / distance at which the letters subtend 5 minutes of arc),
//! given in logMAR, the logarithm of the minimum angle of resolution.

use super::keys;
use super::Eye;
use crate::compute::{n4, Out};
use crate::derived::{DerivedValue as V, Method, Source};
use crate::units::QuantitySpec;
use parax_optics::units::{Dimension, Unit};

/// The first number of a Snellen fraction: the test distance, as written (metres
/// or feet; only the ratio counts). Range [CP]: charts are read from 1 to 20
/// (feet) or 6 (metres); 100 leaves room for any chart.
pub(super) const TEST_DISTANCE: QuantitySpec = QuantitySpec {
    what: "test distance of the Snellen fraction",
    dimension: Dimension::Ratio,
    bare: None,
    usual: Unit::Degree,
    min: 0.1,
    max: 100.0,
};

/// The second number of a Snellen fraction: the distance at which the smallest
/// letters read subtend 5′, in the unit of the first [CP range: charts go to
/// about 20/800].
pub(super) const LETTER_SIZE: QuantitySpec = QuantitySpec {
    what: "letter size of the Snellen fraction",
    dimension: Dimension::Ratio,
    bare: None,
    usual: Unit::Degree,
    min: 0.1,
    max: 1000.0,
};

/// Bailey and Lovie's definition of the logMAR scale.
const BAILEY_LOVIE_1976: &Source = &Source {
    citation: "Bailey & Lovie, New design principles for visual acuity letter charts, Am J Optom Physiol Opt 1976;53:740-745",
    tag: "M",
};

/// logMAR of a Snellen fraction.
const LOGMAR: Method = Method {
    formula: "logMAR = log10(MAR), MAR = D/d minutes of arc for the Snellen fraction d/D",
    source: BAILEY_LOVIE_1976,
};

/// The logMAR of the recorded acuity.
pub(super) fn compute(e: &Eye, out: &mut Out<'_>) {
    let Some(a) = &e.acuity else { return };
    let (d, size) = a.value;
    let logmar = (size / d).log10();
    out.push(
        keys::ACUITY_LOGMAR,
        "visual acuity in logMAR",
        V::Number { value: logmar },
        a.span,
        &LOGMAR,
        || format!("log10({} / {}) = {}", n4(size), n4(d), n4(logmar)),
    );
}

#[cfg(test)]
mod tests {
    use crate::derived::DerivedValue;

    fn logmar(fraction: &str) -> f64 {
        let text = format!("eye right\n  acuity {fraction}\n");
        let (_, ev) = crate::evaluate_source(&text);
        assert!(ev.diagnostics.is_empty(), "{:?}", ev.diagnostics);
        let d = ev
            .derived
            .iter()
            .find(|d| d.is_key("eye.right.acuity-logmar"))
            .expect("a logMAR value");
        match d.value {
            DerivedValue::Number { value } => value,
            ref other => panic!("not a number: {other:?}"),
        }
    }

    #[test]
    fn snellen_fractions_in_logmar() {
        // [M] Bailey & Lovie 1976: 6/6 (20/20) is logMAR 0.0 and each 0.1 is a
        // step of 10^0.1 in letter size; 6/60 (20/200) is 1.0.
        assert!(logmar("6/6").abs() < 1e-12);
        assert!((logmar("6/60") - 1.0).abs() < 1e-12);
        assert!((logmar("20/200") - 1.0).abs() < 1e-12);
        // [C] log10(12/6) = log10 2 (6/12, 20/40: the row "0.3" of a logMAR
        // chart, [M] Bailey & Lovie 1976).
        assert!((logmar("6/12") - 2f64.log10()).abs() < 1e-12);
        assert!((logmar("20/40") - 0.3).abs() < 0.005);
        // [C] better than 6/6 is negative: 6/3 = log10(0.5) = -log10 2.
        assert!((logmar("6/3") + 2f64.log10()).abs() < 1e-12);
    }

    #[test]
    fn a_fraction_without_its_second_number_is_reported() {
        let (_, ev) = crate::evaluate_source("eye right\n  acuity 6\n");
        assert!(ev.derived.iter().all(|d| d.name != "acuity-logmar"));
        assert!(ev.has_errors());
    }
}

//! "Did you mean" suggestions by string similarity (strsim's Jaro-Winkler, with a
//! Damerau-Levenshtein fallback for short words).

/// The candidate closest to `word`, if any is close enough to be a likely typo.
pub fn did_you_mean<'a>(
    word: &str,
    candidates: impl IntoIterator<Item = &'a str>,
) -> Option<&'a str> {
    let word_l = word.to_lowercase();
    let mut best: Option<(f64, &'a str)> = None;
    for c in candidates {
        let c_l = c.to_lowercase();
        if c_l == word_l {
            return Some(c);
        }
        let jw = strsim::jaro_winkler(&word_l, &c_l);
        let dl = strsim::damerau_levenshtein(&word_l, &c_l);
        let close = jw >= 0.85 || (dl <= 2 && dl < c_l.len().max(word_l.len()) / 2 + 1);
        if close && best.is_none_or(|(s, _)| jw > s) {
            best = Some((jw, c));
        }
    }
    best.map(|(_, c)| c)
}

#[cfg(test)]
mod tests {
    use super::did_you_mean;

    #[test]
    fn suggests_near_misses_only() {
        let kw = ["refraction", "keratometry", "axial-length", "add"];
        assert_eq!(did_you_mean("refracton", kw), Some("refraction"));
        assert_eq!(did_you_mean("keratometri", kw), Some("keratometry"));
        assert_eq!(did_you_mean("axial_length", kw), Some("axial-length"));
        assert_eq!(did_you_mean("ad", kw), Some("add"));
        assert_eq!(did_you_mean("banana", kw), None);
    }
}

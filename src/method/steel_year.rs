//! Minimum strengths of structural steel of unknown grade by the year of
//! construction, AASHTO Manual for Bridge Evaluation Table 6A.6.2.1-1 (from
//! memory): before 1905 Fy 26 / Fu 52 ksi; 1905–1936 30 / 60; 1936–1963
//! 33 / 66; after 1963 36 / 66. The report states the assumption.

/// 1 ksi in Pa.
const KSI: f64 = 6.894_757_293_168e6;

/// (Fy, Fu) in Pa for steel of unknown grade built in `year`, and the
/// row of the table used.
pub fn strengths(year: i32) -> (f64, f64, &'static str) {
    let (fy, fu, row) = if year < 1905 {
        (26.0, 52.0, "before 1905")
    } else if year <= 1936 {
        (30.0, 60.0, "1905 to 1936")
    } else if year <= 1963 {
        (33.0, 66.0, "1936 to 1963")
    } else {
        (36.0, 66.0, "after 1963")
    };
    (fy * KSI, fu * KSI, row)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn table_rows() {
        // MBE Table 6A.6.2.1-1 (from memory).
        let ksi = |y| {
            let (fy, fu, _) = strengths(y);
            (
                (fy / KSI * 1e6).round() / 1e6,
                (fu / KSI * 1e6).round() / 1e6,
            )
        };
        assert_eq!(ksi(1890), (26.0, 52.0));
        assert_eq!(ksi(1912), (30.0, 60.0));
        assert_eq!(ksi(1950), (33.0, 66.0));
        assert_eq!(ksi(1975), (36.0, 66.0));
        // 1 ksi = 6.894757 MPa (unit definition).
        assert!((strengths(1912).0 - 206.842_718_8e6).abs() < 1.0);
    }
}

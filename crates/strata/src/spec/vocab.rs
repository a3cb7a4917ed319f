//! The spec's words, each list defined once. Every word enum comes from
//! [`words!`], which gives it `ALL` (word and value, in the order the
//! schema and messages list them), `WORDS`, `word()`, `from_word()` and
//! reading (`read.rs`) and serde writing through the same table. The shape check
//! (`shape.rs`), the JSON Schema, serde and the plan all use these, so no
//! later stage matches spec words as strings.

/// An enum of spec words: `words! { /// doc  pub enum Name { Variant = "word", ... } }`.
macro_rules! words {
    ($(#[$m:meta])* pub enum $name:ident { $($(#[$vm:meta])* $variant:ident = $word:literal),+ $(,)? }) => {
        $(#[$m])*
        #[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
        pub enum $name {
            $($(#[$vm])* $variant),+
        }

        impl $name {
            /// Every word with its value, in the spec's order.
            pub const ALL: &'static [(&'static str, $name)] = &[$(($word, $name::$variant)),+];
            /// Every word, in the spec's order.
            pub const WORDS: &'static [&'static str] = &[$($word),+];

            /// The word as the spec writes it.
            pub fn word(self) -> &'static str {
                match self {
                    $($name::$variant => $word),+
                }
            }

            /// The value of a word, `None` for a word not in the list.
            pub fn from_word(word: &str) -> Option<$name> {
                Self::ALL.iter().find(|(w, _)| *w == word).map(|(_, v)| *v)
            }
        }

        impl serde::Serialize for $name {
            fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
                s.serialize_str(self.word())
            }
        }

        impl crate::spec::read::Word for $name {
            const ALL: &'static [(&'static str, $name)] = $name::ALL;
            const WORDS: &'static [&'static str] = $name::WORDS;
        }

        impl crate::spec::read::Read for $name {
            fn read(v: &serde_json::Value) -> Result<Self, String> {
                crate::spec::read::word(v)
            }
        }
    };
}

words! {
    /// The geometry of a layer. It keeps its name in every coordinate system.
    pub enum Geometry {
        Point = "point",
        Line = "line",
        Step = "step",
        Area = "area",
        Bar = "bar",
        Band = "band",
        Segment = "segment",
        Label = "label",
        Cell = "cell",
        Box = "box",
        Range = "range",
        Region = "region",
    }
}

words! {
    /// The type a column is read as.
    pub enum ColumnType {
        Number = "number",
        Text = "text",
        Date = "date",
        Bool = "bool",
    }
}

words! {
    pub enum DataFormat {
        Csv = "csv",
        Tsv = "tsv",
        Arrow = "arrow",
        Json = "json",
    }
}

words! {
    /// The statistics named by a bare word.
    pub enum StatWord {
        /// Rows as they are (the default).
        None = "none",
        Count = "count",
        Box = "box",
    }
}

words! {
    /// `summary`: one value for each x (and colour, group, panel).
    pub enum SummaryWord {
        Mean = "mean",
        Median = "median",
        Sum = "sum",
        Min = "min",
        Max = "max",
        Count = "count",
        /// The `p` quantile (default 0.5).
        Quantile = "quantile",
        StandardDeviation = "standard_deviation",
    }
}

words! {
    /// `interval`: a band around a summary.
    pub enum IntervalWord {
        /// t-based confidence intervals of the mean at 95, 90, 99 and 80 %.
        Ci95 = "ci95",
        Ci90 = "ci90",
        Ci99 = "ci99",
        Ci80 = "ci80",
        StandardError = "standard_error",
        MinMax = "min_max",
        /// Wilson score interval (95 %) of a proportion.
        Wilson = "wilson",
    }
}

words! {
    pub enum FitWord {
        Linear = "linear",
        Loess = "loess",
    }
}

words! {
    /// How to choose a bin width.
    pub enum BinRule {
        /// Freedman-Diaconis (the default).
        Fd = "fd",
        Scott = "scott",
        Sturges = "sturges",
        Sqrt = "sqrt",
        Rice = "rice",
        Doane = "doane",
    }
}

words! {
    /// Calendar units for binning dates.
    pub enum BinUnit {
        Day = "day",
        Week = "week",
        Month = "month",
        Quarter = "quarter",
        Year = "year",
    }
}

words! {
    pub enum WindowSummary {
        Mean = "mean",
        Sum = "sum",
        RunningTotal = "running_total",
    }
}

words! {
    pub enum LocaleWord {
        En = "en",
        De = "de",
        Fr = "fr",
        Es = "es",
        Pl = "pl",
    }
}

words! {
    /// A density's bandwidth rule.
    pub enum BandwidthRule {
        Scott = "scott",
        Silverman = "silverman",
    }
}

words! {
    pub enum WindowAlign {
        Center = "center",
        Trailing = "trailing",
    }
}

words! {
    /// Position adjustment.
    #[derive(Default)]
    pub enum Arrange {
        #[default]
        None = "none",
        Stack = "stack",
        Beside = "beside",
        Proportion = "proportion",
        Jitter = "jitter",
    }
}

words! {
    pub enum ScaleKind {
        Linear = "linear",
        Log = "log",
        Sqrt = "sqrt",
        Symlog = "symlog",
        Time = "time",
        Category = "category",
        Steps = "steps",
    }
}

words! {
    /// How a `steps` colour scale finds its class breaks (`geo::classify`).
    pub enum BreakMethod {
        Natural = "natural",
        Quantile = "quantile",
        Equal = "equal",
    }
}

words! {
    /// `order` on a category scale: by the value drawn, smallest or largest first.
    pub enum CategoryOrder {
        Ascending = "ascending",
        Descending = "descending",
    }
}

words! {
    pub enum Placement {
        Top = "top",
        Bottom = "bottom",
        Left = "left",
        Right = "right",
        None = "none",
    }
}

words! {
    /// Coordinates named by a bare word.
    pub enum CoordWord {
        Cartesian = "cartesian",
        Polar = "polar",
        Map = "map",
    }
}

words! {
    /// The kind of a map coordinate object.
    pub enum MapKind {
        Map = "map",
    }
}

words! {
    /// Map projections, by their published names (`geo::project`).
    pub enum ProjectionWord {
        EqualEarth = "equal_earth",
        Mercator = "mercator",
        Equirectangular = "equirectangular",
        Albers = "albers",
        LambertConformal = "lambert_conformal",
        LambertEqualArea = "lambert_equal_area",
        Orthographic = "orthographic",
        TransverseMercator = "transverse_mercator",
    }
}

words! {
    /// What a map is fitted to.
    pub enum MapFit {
        Shapes = "shapes",
        Data = "data",
    }
}

words! {
    pub enum PolarKind {
        Polar = "polar",
    }
}

words! {
    /// Which position channel becomes the angle.
    pub enum AngleChannel {
        X = "x",
        Y = "y",
    }
}

words! {
    /// Which position scales each panel trains on its own rows.
    pub enum IndependentAxes {
        X = "x",
        Y = "y",
        Both = "both",
    }
}

words! {
    /// Themes named by a bare word.
    pub enum ThemeWord {
        Auto = "auto",
        Light = "light",
        Dark = "dark",
    }
}

words! {
    /// The theme that overrides start from.
    pub enum ThemeBase {
        Light = "light",
        Dark = "dark",
    }
}

words! {
    /// `data_table`: how the numbers behind the marks are offered as a table.
    #[derive(Default)]
    pub enum DataTable {
        /// A disclosure under the chart that the reader opens.
        #[default]
        Closed = "closed",
        Open = "open",
        None = "none",
    }
}

words! {
    /// A constant point shape (`style.shape`).
    pub enum PointShape {
        Circle = "circle",
        Square = "square",
        Triangle = "triangle",
        Diamond = "diamond",
        Plus = "plus",
        Cross = "cross",
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn words_read_and_write_through_one_table() {
        for (w, g) in Geometry::ALL {
            assert_eq!(g.word(), *w);
            assert_eq!(serde_json::to_value(g).unwrap(), serde_json::json!(w));
            assert_eq!(<Geometry as crate::spec::read::Read>::read(&serde_json::json!(w)).unwrap(), *g);
        }
        assert_eq!(Geometry::WORDS.len(), Geometry::ALL.len());
        let e = <Geometry as crate::spec::read::Read>::read(&serde_json::json!("pie")).unwrap_err();
        assert!(e.contains("unknown variant `pie`"), "{e}");
        assert_eq!(Arrange::default(), Arrange::None);
        assert_eq!(DataTable::default().word(), "closed");
    }

    #[test]
    fn word_lists_shared_with_other_modules_agree() {
        // `scales` keys are the mapped channels.
        let mapped: Vec<&str> = crate::channel::Channel::MAPPED.iter().map(|c| c.name()).collect();
        assert_eq!(super::super::shape::CHANNELS, mapped.as_slice());
        // `style.shape` words name shapes of the shape channel.
        let drawn: Vec<&str> = crate::scale::SHAPES.iter().map(|s| s.name()).collect();
        assert!(PointShape::WORDS.iter().all(|w| drawn.contains(w)), "{drawn:?}");
    }
}

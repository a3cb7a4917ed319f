//! The channels of a layer: the ten a spec maps to columns, and those the
//! statistics and position adjustments add. One enum, so a misspelt channel
//! does not compile; [`Channel::name`] is the text used in output (datum keys,
//! data table headers, spec paths).

use std::fmt;

/// A channel of a layer's rows.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Channel {
    /// Horizontal position (or the angle or radius in polar coordinates).
    X,
    /// Vertical position; after a statistic, its result.
    Y,
    /// Where an extent along x ends: a histogram bin's right edge, a tile's right edge.
    XEnd,
    /// The upper end of a range, band, cell or box whisker (`y` is then the lower end).
    YEnd,
    /// Colour: categories or a ramp.
    Color,
    /// Point area.
    Size,
    /// Point shape.
    Shape,
    /// Mark opacity.
    Opacity,
    /// Label text.
    Text,
    /// Series and groups without a colour.
    Group,
    /// The value that names a row's shape (a `region` layer's link to `shapes.key`).
    Key,
    /// Where a bar's or area's extent starts (0, or the top of the mark below it when stacked).
    YBase,
    /// Where a stacked bar's or area's extent ends (the running total);
    /// `y` keeps the row's own value.
    YTop,
    /// The total of a row's stack (the sum of the values sharing its x).
    Total,
    /// Jitter or dodge within a band, as a fraction of the band (discrete x only).
    XOffset,
    /// Lower end of an interval around `y` (a summary's `interval`, a fit's confidence band).
    YLow,
    /// Upper end of an interval around `y`.
    YHigh,
    /// The summary value on a `range`/`rule` layer whose `y`/`y_end` hold the interval.
    Estimate,
    /// Rows behind a bin, tile or box.
    Count,
    /// A bin's left edge when `x` is the bin middle.
    BinStart,
    /// A bin's right edge when `x` is the bin middle.
    BinEnd,
    /// A density estimate's bandwidth.
    Bandwidth,
    /// The fitted value of a band from a fit.
    Fitted,
    /// `box` or `outlier`, on box plot rows.
    Part,
    /// A box's first quartile.
    Q1,
    /// A box's median.
    Median,
    /// A box's third quartile.
    Q3,
    /// The panel key (`panels.by`).
    Panel,
    /// The row's value of `panels.rows`, naming its grid row.
    PanelRow,
    /// The row's value of `panels.cols`, naming its grid column.
    PanelCol,
}

impl Channel {
    /// Every channel with its name, in the order a spec lists the mapped
    /// ones, then the internal ones.
    pub const ALL: &'static [(&'static str, Channel)] = &[
        ("x", Channel::X),
        ("y", Channel::Y),
        ("x_end", Channel::XEnd),
        ("y_end", Channel::YEnd),
        ("color", Channel::Color),
        ("size", Channel::Size),
        ("shape", Channel::Shape),
        ("opacity", Channel::Opacity),
        ("text", Channel::Text),
        ("group", Channel::Group),
        ("key", Channel::Key),
        ("y_base", Channel::YBase),
        ("y_top", Channel::YTop),
        ("total", Channel::Total),
        ("x_offset", Channel::XOffset),
        ("y_low", Channel::YLow),
        ("y_high", Channel::YHigh),
        ("estimate", Channel::Estimate),
        ("count", Channel::Count),
        ("bin_start", Channel::BinStart),
        ("bin_end", Channel::BinEnd),
        ("bandwidth", Channel::Bandwidth),
        ("fitted", Channel::Fitted),
        ("part", Channel::Part),
        ("q1", Channel::Q1),
        ("median", Channel::Median),
        ("q3", Channel::Q3),
        ("panel", Channel::Panel),
        ("panel_row", Channel::PanelRow),
        ("panel_col", Channel::PanelCol),
    ];

    /// The channels a spec layer maps to columns, in the spec's order.
    pub const MAPPED: [Channel; 11] = [
        Channel::X,
        Channel::Y,
        Channel::XEnd,
        Channel::YEnd,
        Channel::Color,
        Channel::Size,
        Channel::Shape,
        Channel::Opacity,
        Channel::Text,
        Channel::Group,
        Channel::Key,
    ];

    /// The internal channels that place a row in a panel: stacks, series and
    /// statistics never cross them.
    pub const PANEL: [Channel; 3] = [Channel::Panel, Channel::PanelRow, Channel::PanelCol];

    /// The channel's name, as output writes it.
    pub fn name(self) -> &'static str {
        match self {
            Channel::X => "x",
            Channel::Y => "y",
            Channel::XEnd => "x_end",
            Channel::YEnd => "y_end",
            Channel::Color => "color",
            Channel::Size => "size",
            Channel::Shape => "shape",
            Channel::Opacity => "opacity",
            Channel::Text => "text",
            Channel::Group => "group",
            Channel::Key => "key",
            Channel::YBase => "y_base",
            Channel::YTop => "y_top",
            Channel::Total => "total",
            Channel::XOffset => "x_offset",
            Channel::YLow => "y_low",
            Channel::YHigh => "y_high",
            Channel::Estimate => "estimate",
            Channel::Count => "count",
            Channel::BinStart => "bin_start",
            Channel::BinEnd => "bin_end",
            Channel::Bandwidth => "bandwidth",
            Channel::Fitted => "fitted",
            Channel::Part => "part",
            Channel::Q1 => "q1",
            Channel::Median => "median",
            Channel::Q3 => "q3",
            Channel::Panel => "panel",
            Channel::PanelRow => "panel_row",
            Channel::PanelCol => "panel_col",
        }
    }

    /// The channel of a name, `None` for a name that is no channel.
    pub fn from_name(name: &str) -> Option<Channel> {
        Channel::ALL.iter().find(|(n, _)| *n == name).map(|(_, c)| *c)
    }

    /// Internal channels that only help drawing (where an extent starts, an
    /// offset in a band): left out of a mark's datum and of the data table.
    pub fn is_drawing_aid(self) -> bool {
        matches!(self, Channel::YBase | Channel::YTop | Channel::XOffset)
    }
}

/// By name, as a spec writes it (the keys of `scales`).
impl serde::Serialize for Channel {
    fn serialize<S: serde::Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.serialize_str(self.name())
    }
}

impl<'de> serde::Deserialize<'de> for Channel {
    fn deserialize<D: serde::Deserializer<'de>>(d: D) -> Result<Self, D::Error> {
        let name = <std::borrow::Cow<'de, str>>::deserialize(d)?;
        Channel::from_name(&name).ok_or_else(|| serde::de::Error::custom(format!("unknown channel `{name}`")))
    }
}

impl fmt::Display for Channel {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_and_table_agree() {
        for (n, c) in Channel::ALL {
            assert_eq!(c.name(), *n);
            assert_eq!(Channel::from_name(n), Some(*c));
        }
        // Every variant is in the table once (the table is sorted like the enum).
        let mut seen: Vec<Channel> = Channel::ALL.iter().map(|(_, c)| *c).collect();
        let n = seen.len();
        seen.sort();
        seen.dedup();
        assert_eq!(seen.len(), n);
        assert_eq!(Channel::from_name("colour"), None);
    }
}

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

/// A small map keyed by channel, in insertion order: a layer's columns and
/// their names. A layer has at most a few dozen channels, so a list searched
/// from the front is as quick as a hash table and needs no hashing code per
/// value type. Behaves like an insertion-ordered map: `insert` on a present
/// key replaces its value in place, `swap_remove` moves the last entry into
/// the gap, and equality ignores the order.
#[derive(Clone)]
pub struct ChannelMap<V>(Vec<(Channel, V)>);

impl<V> Default for ChannelMap<V> {
    fn default() -> Self {
        ChannelMap(Vec::new())
    }
}

impl<V> ChannelMap<V> {
    pub fn new() -> Self {
        ChannelMap(Vec::new())
    }
    fn position(&self, ch: Channel) -> Option<usize> {
        self.0.iter().position(|(k, _)| *k == ch)
    }
    pub fn len(&self) -> usize {
        self.0.len()
    }
    pub fn is_empty(&self) -> bool {
        self.0.is_empty()
    }
    pub fn get(&self, ch: &Channel) -> Option<&V> {
        self.position(*ch).map(|i| &self.0[i].1)
    }
    pub fn get_mut(&mut self, ch: &Channel) -> Option<&mut V> {
        self.position(*ch).map(|i| &mut self.0[i].1)
    }
    pub fn contains_key(&self, ch: &Channel) -> bool {
        self.position(*ch).is_some()
    }
    /// Set a channel's value; a present channel keeps its place and its old
    /// value is returned.
    pub fn insert(&mut self, ch: Channel, v: V) -> Option<V> {
        match self.position(ch) {
            Some(i) => Some(std::mem::replace(&mut self.0[i].1, v)),
            None => {
                self.0.push((ch, v));
                None
            }
        }
    }
    /// A channel's value, added at the end as `V::default()` when missing.
    pub fn get_or_default(&mut self, ch: Channel) -> &mut V
    where
        V: Default,
    {
        let i = match self.position(ch) {
            Some(i) => i,
            None => {
                self.0.push((ch, V::default()));
                self.0.len() - 1
            }
        };
        &mut self.0[i].1
    }
    /// Take a channel out; the last entry moves into its place.
    pub fn swap_remove(&mut self, ch: &Channel) -> Option<V> {
        self.position(*ch).map(|i| self.0.swap_remove(i).1)
    }
    pub fn iter(&self) -> std::iter::Map<std::slice::Iter<'_, (Channel, V)>, fn(&(Channel, V)) -> (&Channel, &V)> {
        self.0.iter().map(pair)
    }
    pub fn keys(&self) -> impl Iterator<Item = &Channel> {
        self.0.iter().map(|(k, _)| k)
    }
    pub fn values(&self) -> impl Iterator<Item = &V> {
        self.0.iter().map(|(_, v)| v)
    }
    /// The entries in channel order (the enum's), through the engine's one sort.
    pub fn sort_keys(&mut self) {
        let idx = crate::sort::order(self.0.len(), &mut |a, b| self.0[a].0.cmp(&self.0[b].0));
        crate::sort::permute(idx, &mut |i, j| self.0.swap(i, j));
    }
}

fn pair<V>(e: &(Channel, V)) -> (&Channel, &V) {
    (&e.0, &e.1)
}

impl<V> std::ops::Index<&Channel> for ChannelMap<V> {
    type Output = V;
    fn index(&self, ch: &Channel) -> &V {
        self.get(ch).expect("ChannelMap: no entry for the channel")
    }
}

impl<'a, V> IntoIterator for &'a ChannelMap<V> {
    type Item = (&'a Channel, &'a V);
    type IntoIter = std::iter::Map<std::slice::Iter<'a, (Channel, V)>, fn(&(Channel, V)) -> (&Channel, &V)>;
    fn into_iter(self) -> Self::IntoIter {
        self.iter()
    }
}

impl<V> IntoIterator for ChannelMap<V> {
    type Item = (Channel, V);
    type IntoIter = std::vec::IntoIter<(Channel, V)>;
    /// The entries in insertion order.
    fn into_iter(self) -> Self::IntoIter {
        self.0.into_iter()
    }
}

impl<V> FromIterator<(Channel, V)> for ChannelMap<V> {
    fn from_iter<I: IntoIterator<Item = (Channel, V)>>(iter: I) -> Self {
        let mut m = ChannelMap::new();
        for (k, v) in iter {
            m.insert(k, v);
        }
        m
    }
}

impl<V: PartialEq> PartialEq for ChannelMap<V> {
    fn eq(&self, other: &Self) -> bool {
        self.len() == other.len() && self.0.iter().all(|(k, v)| other.get(k) == Some(v))
    }
}

impl<V: fmt::Debug> fmt::Debug for ChannelMap<V> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.debug_map().entries(self.iter()).finish()
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

    /// The map keeps `indexmap::IndexMap`'s insertion-order rules (the type
    /// it replaced), checked against an `IndexMap` doing the same steps.
    #[test]
    fn channel_map_orders_like_an_insertion_ordered_map() {
        let mut m = ChannelMap::new();
        let mut r = indexmap::IndexMap::new();
        for (k, v) in [(Channel::Y, 1), (Channel::X, 2), (Channel::Color, 3), (Channel::Y, 4), (Channel::Text, 5)] {
            assert_eq!(m.insert(k, v), r.insert(k, v));
        }
        assert_eq!(m.swap_remove(&Channel::X), r.swap_remove(&Channel::X));
        assert_eq!(m.swap_remove(&Channel::Size), r.swap_remove(&Channel::Size));
        let pairs = |m: &ChannelMap<i32>| m.iter().map(|(k, v)| (*k, *v)).collect::<Vec<_>>();
        assert_eq!(pairs(&m), r.iter().map(|(k, v)| (*k, *v)).collect::<Vec<_>>());
        assert_eq!(m[&Channel::Y], 4);
        assert!(m.contains_key(&Channel::Color) && !m.contains_key(&Channel::X));
        m.sort_keys();
        r.sort_keys();
        assert_eq!(pairs(&m), r.iter().map(|(k, v)| (*k, *v)).collect::<Vec<_>>());
        // Equality ignores the order, as IndexMap's does.
        let other: ChannelMap<i32> = pairs(&m).into_iter().rev().collect();
        assert_eq!(other, m);
    }
}

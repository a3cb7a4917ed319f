//! One hash index for every map of the engine that needs hashing (text
//! dictionaries, category places, groups, the label grid), so the page's
//! engine carries one copy of the probing code instead of a hash table's
//! insert, find and rehash for each key and value type.
//!
//! [`Index`] is not generic: it maps a key's hash to a `u32` id the caller
//! chooses (usually the key's place in a `Vec` the caller keeps, which also
//! gives insertion order for free: iteration is always over the caller's
//! `Vec`, never over the table). The caller hashes its key with the index's
//! [`Hasher`] and says which ids are equal to the key through a `&dyn Fn`.
//!
//! Open addressing with linear probing, at most three quarters full: a
//! slot is a byte (empty, or 7 bits of the hash, so most slots of a run are
//! passed without comparing keys) and a `u32` id, 5 bytes a slot. The hash
//! has no secret key (nothing on the page gives one), so keys crafted to
//! collide could make probing quadratic; an insert that
//! probes more than [`LONG_PROBE`] slots draws a new seed and hashes every
//! entry again (at most [`RESEEDS`] times an index), so keys colliding under
//! one seed are spread by the next.

/// A probe this long on insert draws a new seed: at most three quarters
/// full, linear probing almost never sees a run of 512 with a good hash
/// (the chance an insert does falls as about exp(-0.038 x the run's
/// length), 4e-9 at 512).
pub const LONG_PROBE: usize = 512;
/// New seeds drawn at most, per index.
pub const RESEEDS: u32 = 8;

/// Hashes a key for an [`Index`]: FNV-1a over 8-byte words, each word mixed
/// by a rotation, started from the index's seed and finished with a
/// multiply-xorshift so both halves of the result depend on every bit.
#[derive(Clone, Copy)]
pub struct Hasher(u64);

const PRIME: u64 = 0x0000_0100_0000_01b3;

impl Hasher {
    /// The bytes, with their length (so `("ab", "c")` and `("a", "bc")` differ).
    #[inline]
    pub fn bytes(self, b: &[u8]) -> Hasher {
        let mut h = self.0 ^ (b.len() as u64).wrapping_mul(PRIME);
        let mut chunks = b.chunks_exact(8);
        for c in &mut chunks {
            h = (h ^ u64::from_le_bytes([c[0], c[1], c[2], c[3], c[4], c[5], c[6], c[7]])).wrapping_mul(PRIME).rotate_left(29);
        }
        for &x in chunks.remainder() {
            h = (h ^ x as u64).wrapping_mul(PRIME);
        }
        Hasher(h)
    }
    #[inline]
    pub fn u64(self, x: u64) -> Hasher {
        Hasher((self.0 ^ x).wrapping_mul(PRIME).rotate_left(29))
    }
    /// A string that may be missing (missing and `""` differ).
    pub fn opt_str(self, s: Option<&str>) -> Hasher {
        match s {
            Some(s) => self.u64(1).bytes(s.as_bytes()),
            None => self.u64(0),
        }
    }
    #[inline]
    pub fn finish(self) -> u64 {
        let mut h = self.0;
        h ^= h >> 32;
        h = h.wrapping_mul(0xd6e8_feb8_6659_fd93);
        h ^= h >> 32;
        h
    }
}

/// Hash-found ids (see the module's notes).
#[derive(Clone, Default)]
pub struct Index {
    /// Per slot: 0 when empty, else 0x80 and the hash's top 7 bits.
    tags: Vec<u8>,
    /// Per slot: the id (when the tag says the slot is full).
    ids: Vec<u32>,
    len: u32,
    seed: u64,
    reseeds: u32,
}

#[cfg(test)]
thread_local! {
    /// Slots looked at by this thread's indexes, for the tests of the probe bound.
    static PROBES: std::cell::Cell<u64> = const { std::cell::Cell::new(0) };
}

impl std::fmt::Debug for Index {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "Index({} ids)", self.len)
    }
}

/// The slot's tag: the hash's top 7 bits, marked full (the low bits pick the slot).
#[inline]
fn tag(h: u64) -> u8 {
    0x80 | (h >> 57) as u8
}

impl Index {
    pub fn new() -> Index {
        Index::default()
    }
    /// Room for `n` ids before the table grows.
    pub fn with_capacity(n: usize) -> Index {
        let mut ix = Index::default();
        if n > 0 {
            let slots = (n + n / 3 + 1).next_power_of_two().max(8);
            (ix.tags, ix.ids) = (vec![0; slots], vec![0; slots]);
        }
        ix
    }
    pub fn len(&self) -> usize {
        self.len as usize
    }
    pub fn is_empty(&self) -> bool {
        self.len == 0
    }
    /// The hasher to hash keys with (its seed changes when the index reseeds:
    /// hash afresh for every call).
    #[inline]
    pub fn hasher(&self) -> Hasher {
        Hasher(0xcbf2_9ce4_8422_2325 ^ self.seed)
    }
    /// The id equal to the key (`eq`), `hash` being the key's hash by [`hasher`](Self::hasher).
    pub fn find(&self, hash: u64, eq: &dyn Fn(u32) -> bool) -> Option<u32> {
        match self.probe(hash, eq) {
            (Ok(id), _) => Some(id),
            _ => None,
        }
    }
    /// `Ok(id)` of the entry equal to the key, or `Err(new)` after adding `new`
    /// for it. `key` hashes the key and `entry` hashes id `i`'s key, both with
    /// the hasher they are given (`entry` is called when the table grows or
    /// draws a new seed, never for `new`, which may not be stored yet).
    pub fn find_or_insert(&mut self, key: &dyn Fn(Hasher) -> u64, eq: &dyn Fn(u32) -> bool, new: u32, entry: &dyn Fn(u32, Hasher) -> u64) -> Result<u32, u32> {
        self.find_or_insert_inline(key, eq, new, entry)
    }
    /// [`find_or_insert`](Self::find_or_insert) compiled into its caller,
    /// where the closures are known: for the hot path only (the text
    /// dictionaries of the readers), as each caller gets a copy.
    #[inline(always)]
    pub fn find_or_insert_inline(
        &mut self,
        key: &dyn Fn(Hasher) -> u64,
        eq: &dyn Fn(u32) -> bool,
        new: u32,
        entry: &dyn Fn(u32, Hasher) -> u64,
    ) -> Result<u32, u32> {
        // At most three quarters full.
        if 4 * (self.len as usize + 1) > 3 * self.tags.len() {
            self.rebuild((2 * self.tags.len()).max(8), entry);
        }
        let hash = key(self.hasher());
        let (at, probes) = self.probe(hash, eq);
        let slot = match at {
            Ok(id) => return Ok(id),
            Err(slot) => slot,
        };
        self.tags[slot] = tag(hash);
        self.ids[slot] = new;
        self.len += 1;
        if probes > LONG_PROBE && self.reseeds < RESEEDS {
            self.reseed(&|i, h| if i == new { key(h) } else { entry(i, h) });
        }
        Err(new)
    }
    /// Add `new`, whose key is not in the index yet, hashed by `key`; `entry`
    /// as for [`find_or_insert`](Self::find_or_insert).
    pub fn insert(&mut self, key: &dyn Fn(Hasher) -> u64, new: u32, entry: &dyn Fn(u32, Hasher) -> u64) {
        let _ = self.find_or_insert(key, &|_| false, new, entry);
    }
    /// `Ok(id)` when found, else `Err(the empty slot ending the run)`, with the
    /// slots looked at.
    #[inline(always)]
    fn probe(&self, hash: u64, eq: &dyn Fn(u32) -> bool) -> (Result<u32, usize>, usize) {
        if self.tags.is_empty() {
            return (Err(0), 0);
        }
        let t = tag(hash);
        let mask = self.tags.len() - 1;
        let mut i = hash as usize & mask;
        let mut n = 0;
        loop {
            n += 1;
            #[cfg(test)]
            PROBES.with(|p| p.set(p.get() + 1));
            let s = self.tags[i];
            if s == 0 {
                return (Err(i), n);
            }
            if s == t && eq(self.ids[i]) {
                return (Ok(self.ids[i]), n);
            }
            i = (i + 1) & mask;
        }
    }
    /// `n` slots, every entry hashed (by `entry`) and placed again.
    fn rebuild(&mut self, n: usize, entry: &dyn Fn(u32, Hasher) -> u64) {
        let hasher = self.hasher();
        let tags = std::mem::replace(&mut self.tags, vec![0; n]);
        let ids = std::mem::replace(&mut self.ids, vec![0; n]);
        let mask = n - 1;
        for (t, id) in tags.into_iter().zip(ids) {
            if t != 0 {
                let h = entry(id, hasher);
                let mut i = h as usize & mask;
                while self.tags[i] != 0 {
                    i = (i + 1) & mask;
                }
                self.tags[i] = tag(h);
                self.ids[i] = id;
            }
        }
    }
    /// A new seed (a step of SplitMix64), every entry hashed and placed again.
    #[cold]
    fn reseed(&mut self, entry: &dyn Fn(u32, Hasher) -> u64) {
        self.reseeds += 1;
        self.seed = self.seed.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = self.seed;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        self.seed = z ^ (z >> 31);
        self.rebuild(self.tags.len(), entry);
    }
}

/// Strings in a caller's list found by value: id `i` is `list[i]`. The map
/// type of category places, column names and the like.
#[derive(Clone, Default, Debug)]
pub struct Places(Index);

/// A `Places` is a function of the list it indexes (ids are places in it),
/// so beside equal lists, as many strings added means the same map: the
/// owner compares the lists.
impl PartialEq for Places {
    fn eq(&self, other: &Places) -> bool {
        self.0.len == other.0.len
    }
}

impl Places {
    pub fn new() -> Places {
        Places::default()
    }
    /// Places of every string of `list`, each found at its first place.
    pub fn of(list: &[String]) -> Places {
        let mut p = Places(Index::with_capacity(list.len()));
        for i in 0..list.len() {
            p.add(list, i);
        }
        p
    }
    fn hash(h: Hasher, s: &str) -> u64 {
        h.bytes(s.as_bytes()).finish()
    }
    /// The first place of `s` in `list` among those added.
    pub fn get(&self, list: &[String], s: &str) -> Option<usize> {
        self.0.find(Self::hash(self.0.hasher(), s), &|i| list[i as usize] == s).map(|i| i as usize)
    }
    /// Add `list[i]` unless an equal string was added: its first place.
    pub fn add(&mut self, list: &[String], i: usize) -> usize {
        let s = list[i].as_str();
        match self.0.find_or_insert(&|h| Self::hash(h, s), &|j| list[j as usize] == s, i as u32, &|j, h| Self::hash(h, &list[j as usize])) {
            Ok(j) | Err(j) => j as usize,
        }
    }
    /// Append `s` to `list` unless it is there: its place.
    pub fn push(&mut self, list: &mut Vec<String>, s: &str) -> usize {
        let l: &[String] = list;
        match self.0.find_or_insert(&|h| Self::hash(h, s), &|j| l[j as usize] == s, l.len() as u32, &|j, h| Self::hash(h, &l[j as usize])) {
            Ok(j) => j as usize,
            Err(j) => {
                list.push(s.to_string());
                j as usize
            }
        }
    }
}

/// Rows grouped by a key, groups in order of first appearance, each with
/// its rows in order.
pub fn group_rows(n: usize, key: &dyn Fn(usize) -> Vec<Option<String>>) -> Vec<(Vec<Option<String>>, Vec<usize>)> {
    fn hash(h: Hasher, k: &[Option<String>]) -> u64 {
        k.iter().fold(h.u64(k.len() as u64), |h, s| h.opt_str(s.as_deref())).finish()
    }
    let mut index = Index::new();
    let mut groups: Vec<(Vec<Option<String>>, Vec<usize>)> = Vec::new();
    for i in 0..n {
        let k = key(i);
        let g = groups.len() as u32;
        match index.find_or_insert(&|h| hash(h, &k), &|j| groups[j as usize].0 == k, g, &|j, h| hash(h, &groups[j as usize].0)) {
            Ok(j) => groups[j as usize].1.push(i),
            Err(_) => groups.push((k, vec![i])),
        }
    }
    groups
}

/// Slots looked at so far by the indexes of this thread (tests of the probe bound).
#[cfg(test)]
pub(crate) fn probes() -> u64 {
    PROBES.with(|p| p.get())
}

/// `n` distinct 16-byte keys whose hashes under a fresh index's seed are
/// all the same: the first 8-byte word is free, the second solved for (each
/// step of [`Hasher::bytes`] can be undone), as an attacker knowing the
/// hash would craft them. `ascii`: only keys of bytes below 0x80 (valid
/// UTF-8, so they can be text cells), found by trying first words.
#[cfg(test)]
pub(crate) fn colliding_keys(n: usize, ascii: bool) -> Vec<Vec<u8>> {
    // PRIME's inverse mod 2^64 by Newton's iteration.
    let mut inv: u64 = PRIME;
    for _ in 0..6 {
        inv = inv.wrapping_mul(2u64.wrapping_sub(PRIME.wrapping_mul(inv)));
    }
    assert_eq!(PRIME.wrapping_mul(inv), 1);
    let start = Index::new().hasher().0;
    let target: u64 = 0x0123_4567_89ab_cdef;
    let mut out = Vec::with_capacity(n);
    let mut c: u64 = 0;
    while out.len() < n {
        c += 1;
        // Seven bits a byte: every first word is ASCII, and distinct.
        let first: [u8; 8] = std::array::from_fn(|b| (c >> (7 * b)) as u8 & 0x7f);
        let mut h = start ^ 16u64.wrapping_mul(PRIME);
        h = (h ^ u64::from_le_bytes(first)).wrapping_mul(PRIME).rotate_left(29);
        let second = (target.rotate_right(29).wrapping_mul(inv) ^ h).to_le_bytes();
        if ascii && second.iter().any(|b| *b >= 0x80) {
            continue;
        }
        let mut k = first.to_vec();
        k.extend_from_slice(&second);
        out.push(k);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The property tests' generator: the engine's own SplitMix64 (stat::rng).
    struct Rng(crate::stat::rng::SplitMix64);
    impl Rng {
        fn next(&mut self) -> u64 {
            self.0.next_u64()
        }
    }

    /// Checked against Rust std collections::HashMap, 1.95 (the outside
    /// reference): random inserts and lookups over a small key space, the
    /// hash cut down to a few values so that keys collide in the table and
    /// runs are long, give the same answers as a `HashMap<u64, u32>`.
    #[test]
    fn agrees_with_std_hash_map_on_random_sequences_with_collisions() {
        for (seed, hash_bits) in [(1u64, 2u32), (2, 5), (3, 64), (4, 1), (5, 12)] {
            let mut rng = Rng(crate::stat::rng::SplitMix64::new(seed));
            let mut reference: std::collections::HashMap<u64, u32> = std::collections::HashMap::new();
            let mut keys: Vec<u64> = Vec::new();
            let mut ix = Index::new();
            // The key's hash keeps only `hash_bits` bits of the real one.
            let cut = |h: u64| if hash_bits >= 64 { h } else { (h & ((1 << hash_bits) - 1)).wrapping_mul(0x1_0000_0001) };
            for _ in 0..3000 {
                let k = rng.next() % 700;
                if rng.next().is_multiple_of(3) {
                    let h = cut(ix.hasher().u64(k).finish());
                    let got = ix.find(h, &|i| keys[i as usize] == k);
                    assert_eq!(got, reference.get(&k).copied(), "find {k}");
                } else {
                    let new = keys.len() as u32;
                    let got = ix.find_or_insert(&|h| cut(h.u64(k).finish()), &|i| keys[i as usize] == k, new, &|i, h| cut(h.u64(keys[i as usize]).finish()));
                    match reference.get(&k) {
                        Some(&id) => assert_eq!(got, Ok(id)),
                        None => {
                            assert_eq!(got, Err(new));
                            reference.insert(k, new);
                            keys.push(k);
                        }
                    }
                }
                assert_eq!(ix.len(), reference.len());
            }
            for (k, id) in &reference {
                assert_eq!(ix.find(cut(ix.hasher().u64(*k).finish()), &|i| keys[i as usize] == *k), Some(*id));
            }
        }
    }

    #[test]
    fn places_keep_the_first_place_and_insertion_order() {
        let list: Vec<String> = ["b", "a", "b", "", "c"].iter().map(|s| s.to_string()).collect();
        let p = Places::of(&list);
        assert_eq!(p.get(&list, "b"), Some(0));
        assert_eq!(p.get(&list, "a"), Some(1));
        assert_eq!(p.get(&list, ""), Some(3));
        assert_eq!(p.get(&list, "d"), None);
        let mut cats = vec![];
        let mut q = Places::new();
        for s in ["x", "y", "x", "z", "y"] {
            q.push(&mut cats, s);
        }
        assert_eq!(cats, ["x", "y", "z"]);
    }

    #[test]
    fn groups_in_order_of_first_appearance() {
        let keys = [Some("a"), None, Some("b"), Some("a"), None, Some("")];
        let g = group_rows(keys.len(), &|i| vec![keys[i].map(str::to_string)]);
        let got: Vec<(Option<&str>, &[usize])> = g.iter().map(|(k, r)| (k[0].as_deref(), r.as_slice())).collect();
        assert_eq!(got, vec![(Some("a"), &[0, 3][..]), (None, &[1, 4][..]), (Some("b"), &[2][..]), (Some(""), &[5][..])]);
    }

    /// Keys crafted to collide fully (every 64 bits) under the index's first
    /// seed: 16 bytes each, the last 8-byte word solved for so that the
    /// hasher's state comes out the same, as an attacker knowing the hash
    /// would. Without the reseed, n keys cost about n * n / 2 probes; the
    /// index must stay linear.
    #[test]
    fn crafted_collisions_do_not_go_quadratic() {
        let keys = colliding_keys(20_000, false);
        let start = Index::new().hasher();
        // They do collide under the first seed.
        for k in &keys[..100] {
            assert_eq!(start.bytes(k).finish(), start.bytes(&keys[100]).finish());
        }
        let n = keys.len();
        let before = probes();
        let mut ix = Index::new();
        let mut stored: Vec<&[u8]> = vec![];
        for k in &keys {
            let new = stored.len() as u32;
            let r = ix.find_or_insert(&|h| h.bytes(k).finish(), &|i| stored[i as usize] == &k[..], new, &|i, h| h.bytes(stored[i as usize]).finish());
            assert_eq!(r, Err(new));
            stored.push(k);
        }
        for (i, k) in keys.iter().enumerate() {
            assert_eq!(ix.find(ix.hasher().bytes(k).finish(), &|j| stored[j as usize] == &k[..]), Some(i as u32));
        }
        let probes = probes() - before;
        assert!(ix.reseeds >= 1, "the long run drew a new seed");
        // Quadratic would be about n * n / 2 = 2e8; bounded, a few a key plus
        // the run before the reseed (at most LONG_PROBE keys).
        let long = LONG_PROBE as u64;
        assert!(probes < 20 * n as u64 + long * long, "{probes} probes for {n} colliding keys");
    }

    /// Without the reseed (as when every seed is spent) the same keys are
    /// quadratic: what the bound above prevents.
    #[test]
    fn a_single_forced_hash_is_quadratic_without_a_reseed() {
        let mut ix = Index::new();
        ix.reseeds = RESEEDS;
        let before = probes();
        let n = 1000u32;
        for i in 0..n {
            ix.insert(&|_| 7, i, &|_, _| 7);
        }
        assert!(probes() - before > (n as u64) * (n as u64) / 2 - 1);
    }
}

"""Writes the invented demo data of Strata's examples (Harrow Hill community
orchard). Every number here is made up; run with any Python 3 to regenerate."""
import csv, math, random

rng = random.Random(20261201)
varieties = ["Bramley", "Cox", "Russet", "Discovery"]
with open("orchard_trees.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["tree", "variety", "age_years", "yield_kg", "planted"])
    for i in range(48):
        v = varieties[i % 4]
        age = rng.randint(3, 40)
        base = {"Bramley": 1.6, "Cox": 1.1, "Russet": 0.9, "Discovery": 1.3}[v]
        y = max(2.0, base * 40 * (1 - math.exp(-age / 12)) + rng.gauss(0, 5))
        w.writerow([f"T{i+1:02d}", v, age, f"{y:.1f}", f"{2026-age}-{rng.randint(1,12):02d}-{rng.randint(1,28):02d}"])

months = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"]
with open("orchard_visitors.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["month", "gate", "visitors"])
    for gate, scale in [("Lane gate", 1.0), ("River gate", 0.6)]:
        for k, m in enumerate(months):
            season = 0.5 + 0.5 * math.sin((k - 3) / 12 * 2 * math.pi)
            w.writerow([m, gate, int(round(scale * (120 + 480 * season + rng.gauss(0, 25))))])

with open("orchard_harvest.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["variety", "season", "harvest_kg"])
    for v in varieties:
        for s in ["2024", "2025"]:
            w.writerow([v, s, rng.randint(180, 720)])

# Daily air temperature at the orchard's weather post, 2025.
with open("orchard_weather.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["day", "temp_c"])
    import datetime
    d0 = datetime.date(2025, 1, 1)
    for k in range(365):
        season = -math.cos((k - 15) / 365 * 2 * math.pi)
        w.writerow([(d0 + datetime.timedelta(days=k)).isoformat(), f"{9.5 + 8.0 * season + rng.gauss(0, 2.6):.1f}"])

# Hourly wind readings: direction (8 points) and speed band.
directions = ["N", "NE", "E", "SE", "S", "SW", "W", "NW"]
weights = [6, 4, 3, 5, 9, 14, 11, 7]
with open("orchard_wind.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["direction", "speed", "hours"])
    for d, wt in zip(directions, weights):
        for band, share in [("calm to light", 0.5), ("moderate", 0.35), ("strong", 0.15)]:
            w.writerow([d, band, int(round(wt * share * 20 * (0.8 + 0.4 * rng.random())))])

# Change in yield per plot against last season, percent (gains and losses):
# a second generator, so the files above keep their numbers.
rng2 = random.Random(20261202)
plots = ["Top meadow", "Old wall", "Pond side", "North hedge", "Nursery row", "Lane corner", "Well field", "Bee garden"]
with open("orchard_plots.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["plot", "change_pct"])
    for p in plots:
        w.writerow([p, f"{rng2.gauss(2, 9):.1f}"])

# Monthly rain at three gauges, one column a month (a wide table).
with open("orchard_rain_wide.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["gauge"] + [m.lower() for m in months])
    for gauge, wet in [("Hilltop", 1.25), ("Orchard gate", 1.0), ("Brook", 0.85)]:
        row = [gauge]
        for k in range(12):
            season = 0.5 + 0.5 * math.cos((k - 0.5) / 12 * 2 * math.pi)
            row.append(int(round(wet * (38 + 62 * season + rng2.gauss(0, 9)))))
        w.writerow(row)

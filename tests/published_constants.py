"""Published constants of 24 pure compounds, for tests (not collected).

Every row carries published values, as carried by chemicals 1.5.2 and
CoolProp 8.0.0: Tc, Pc from the IUPAC critical-data series (Ambrose &
Tsonopoulos 1995, Tsonopoulos & Ambrose 1995, Gude & Teja 1995, Kudchadker
et al. 2001) or the reference equation of state named per row; Tb from the CRC Handbook 95th ed. at 101.325 kPa; omega
from the reference EOS, else Horstmann et al. 2005 (PSRK); Zc from the IUPAC
file or the EOS; M from IUPAC 2021 standard atomic weights.
"""

from __future__ import annotations

R = 8.314462618  # J/(mol K), exact (SI 2019)

# name, CAS, formula, family, M g/mol, Tc K, Pc MPa, Tb K (None: sublimes), omega, Zc ; source of Tc,Pc / omega
_ROWS = [
    ("methane", "74-82-8", "CH4", "n-alkane", 16.043, 190.564, 4.599, 111.65, 0.0114, 0.286),  # I2 / Setzmann 1991
    ("ethane", "74-84-0", "C2H6", "n-alkane", 30.070, 305.32, 4.872, 184.55, 0.099, 0.279),  # I2 / Buecker 2006
    ("propane", "74-98-6", "C3H8", "n-alkane", 44.097, 369.83, 4.248, 231.04, 0.152, 0.277),  # I2 / Lemmon 2009
    ("n-butane", "106-97-8", "C4H10", "n-alkane", 58.124, 425.12, 3.796, 272.65, 0.201, 0.274),  # I2 / Buecker 2006
    ("n-pentane", "109-66-0", "C5H12", "n-alkane", 72.151, 469.7, 3.370, 309.21, 0.251, 0.268),  # I2 / Thol 2019
    ("n-hexane", "110-54-3", "C6H14", "n-alkane", 86.178, 507.6, 3.025, 341.87, 0.300, 0.264),  # I2 / Thol 2019
    ("n-heptane", "142-82-5", "C7H16", "n-alkane", 100.205, 540.2, 2.740, 371.53, 0.349, 0.261),  # I2 / Span 2003
    ("n-octane", "111-65-9", "C8H18", "n-alkane", 114.232, 568.7, 2.490, 398.77, 0.398, 0.259),  # I2 / Beckmueller 2019
    ("n-decane", "124-18-5", "C10H22", "n-alkane", 142.286, 617.7, 2.110, 447.25, 0.488, 0.256),  # Lemmon 2006, I2 Pc
    ("methanol", "67-56-1", "CH4O", "1-alkanol", 32.042, 512.5, 8.084, 337.65, 0.565, 0.223),  # I4 / de Reuck 1993
    ("ethanol", "64-17-5", "C2H6O", "1-alkanol", 46.069, 514.0, 6.137, 351.39, 0.644, 0.241),  # I4 / Schroeder 2014
    ("1-propanol", "71-23-8", "C3H8O", "1-alkanol", 60.096, 536.8, 5.169, 370.19, 0.624, 0.252),  # I4 / PSRK
    ("1-butanol", "71-36-3", "C4H10O", "1-alkanol", 74.123, 563.0, 4.414, 390.75, 0.590, 0.258),  # I4 / PSRK
    ("benzene", "71-43-2", "C6H6", "aromatic", 78.114, 562.05, 4.895, 353.23, 0.211, 0.268),  # I3 / Thol 2012
    ("toluene", "108-88-3", "C7H8", "aromatic", 92.141, 591.75, 4.108, 383.75, 0.266, 0.264),  # I3 / Lemmon 2006
    ("ethylbenzene", "100-41-4", "C8H10", "aromatic", 106.168, 617.15, 3.609, 409.35, 0.304, 0.263),  # I3 / Zhou 2012
    ("p-xylene", "106-42-3", "C8H10", "aromatic", 106.168, 616.2, 3.511, 411.45, 0.324, 0.259),  # I3 / Zhou 2012
    ("acetone", "67-64-1", "C3H6O", "ketone", 58.080, 508.1, 4.700, 329.23, 0.307, 0.237),  # I7 / Lemmon 2006
    ("2-butanone", "78-93-3", "C4H8O", "ketone", 72.107, 536.7, 4.207, 352.75, 0.329, 0.252),  # I7 / PSRK
    ("water", "7732-18-5", "H2O", "inorganic", 18.015, 647.096, 22.064, 373.124, 0.344, 0.229),  # IAPWS
    ("ammonia", "7664-41-7", "H3N", "inorganic", 17.031, 405.56, 11.363, 239.82, 0.256, 0.246),  # Gao 2020
    ("carbon dioxide", "124-38-9", "CO2", "inorganic", 44.009, 304.128, 7.3773, None, 0.224, 0.275),  # Span 1996
    ("nitrogen", "7727-37-9", "N2", "inorganic", 28.014, 126.192, 3.3958, 77.355, 0.037, 0.289),  # Span 2000
    ("hydrogen sulfide", "7783-06-4", "H2S", "inorganic", 34.076, 373.1, 9.000, 212.85, 0.100, 0.285),  # Lemmon 2006
]


def compounds(with_vc: bool = True) -> list[dict]:
    """Rows in canonical units; vc derived as Zc R Tc / Pc from the published Zc [derived]."""
    out = []
    for i, (name, cas, formula, family, m, tc, pc, tb, omega, zc) in enumerate(_ROWS, start=1):
        row = {"compound_id": f"P{i:02d}", "name": name, "cas": cas, "formula": formula, "family": family,
               "molar_mass": m, "tc": tc, "pc": pc * 1e6, "tb": tb, "omega": omega, "zc": zc}
        if with_vc:
            row["vc"] = float(f"{zc * R * tc / (pc * 1e6):.6g}")
        out.append(row)
    return out

"""Write classifier_reference.csv: an INVENTED labelled count table for the scikit-learn check.

Run once; the CSV is committed. The three classes and every sample are invented: they are
points counted from compositions drawn around three made-up centres, with much overlap so the
unpenalised maximum-likelihood fit exists. No real sand or setting is described.
"""
import numpy as np

rng = np.random.default_rng(20250101)
cats = ["Qm", "Qp", "C", "P", "K", "Lv", "Ls", "Lm"]
centres = {
    "class-a": [55, 4, 2, 10, 12, 4, 8, 5],
    "class-b": [30, 3, 1, 22, 8, 22, 8, 6],
    "class-c": [35, 9, 6, 10, 5, 8, 17, 10],
}
rows = ["sample,Qm,Qp,C,P,K,Lv,Ls,Lm,group,note"]
for label, centre in centres.items():
    c = np.log(np.array(centre, float))
    for i in range(30):
        x = np.exp(c + rng.normal(0, 0.45, len(c)))
        n = int(rng.integers(300, 501))
        counts = rng.multinomial(n, x / x.sum())
        counts = np.maximum(counts, 1)  # no zeros: the check is about the fit, not zeros
        rows.append(f"{label}-{i:02d}," + ",".join(str(v) for v in counts) + f",{label},invented")
open("classifier_reference.csv", "w").write("\n".join(rows) + "\n")

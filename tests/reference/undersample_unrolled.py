"""Measured graphs by brute force: the latent projection of the time-unrolled graph (NetworkX).

Input (stdin, JSON): a list of {"n": int, "rows": [[0/1]*n]*n (rows[i][j] = 1: i -> j), "u": int}.
Output: a list of {"directed": [[i, j]], "bidirected": [[i, j]] (i < j), "other": int}.

The causal-step graph is unrolled over steps 0 … 2u (node (v, t), edge (i, t) -> (j, t + 1));
only steps 0, u and 2u are observed. Between the observed steps u and 2u the latent projection
(Verma & Pearl) has a -> b when a directed path from a to b runs through latent nodes only, and
a <-> b when some latent node reaches both a and b through latent nodes only. "other" counts
projected edges of any other shape between those two steps (none are expected).
"""
import json
import sys

import networkx as nx


def project(n, rows, u):
    g = nx.DiGraph()
    T = 2 * u
    for t in range(T + 1):
        for v in range(n):
            g.add_node((v, t))
    for t in range(T):
        for i in range(n):
            for j in range(n):
                if rows[i][j]:
                    g.add_edge((i, t), (j, t + 1))
    observed = {(v, t) for v in range(n) for t in (0, u, T)}
    latent = [x for x in g.nodes if x not in observed]

    def through_latent(a, b):
        h = g.subgraph(latent + [a, b])
        return nx.has_path(h, a, b)

    def latent_ancestors(a):
        h = g.subgraph(latent + [a])
        return {x for x in nx.ancestors(h, a) if x not in observed}

    obs = [(v, t) for t in (u, T) for v in range(n)]
    anc = {a: latent_ancestors(a) for a in obs}
    directed, bidirected, other = [], [], 0
    for a in obs:
        for b in obs:
            if a != b and through_latent(a, b):
                if a[1] == u and b[1] == T:
                    directed.append([a[0], b[0]])
                else:
                    other += 1
    for x in range(len(obs)):
        for y in range(x + 1, len(obs)):
            a, b = obs[x], obs[y]
            if anc[a] & anc[b]:
                if a[1] == T and b[1] == T:
                    bidirected.append(sorted([a[0], b[0]]))
                elif a[1] != b[1]:
                    other += 1
    return {"directed": sorted(directed), "bidirected": sorted(bidirected), "other": other}


cases = json.load(sys.stdin)
json.dump([project(c["n"], c["rows"], c["u"]) for c in cases], sys.stdout)

"""The sizing core: line -> state -> candidates -> hydraulics -> verdicts -> result.

``engine`` rates a line's candidates and selects; ``scan`` walks the candidates using the trends the criteria
declare; ``cases`` joins a line's operating cases; ``selection`` builds results; ``services`` loads criteria
files (services and pipe classes); ``headroom`` rates a line at its size for more flow; ``batch`` runs a whole
line list, here or on worker processes.
"""

"""heatledger: heat-transfer engine."""

"""heatledger_xl"""

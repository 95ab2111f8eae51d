// Placeholder until the CLI lands (lead is writing it now).
int main() { return 2; }

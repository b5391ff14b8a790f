// Placeholder front end; replaced by the real command line.
int main() { return 0; }

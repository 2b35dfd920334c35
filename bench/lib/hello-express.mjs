// The baseline for the API benchmark: a bare Express 5 hello-world on the loopback interface.
// Prints {"port": N} once listening; stops on SIGTERM.
import express from 'express';

const app = express();
app.get('/', (_req, res) => {
  res.send('Hello World!');
});
const server = app.listen(0, '127.0.0.1', () => {
  process.stdout.write(`${JSON.stringify({ port: server.address().port })}\n`);
});
process.on('SIGTERM', () => server.close(() => process.exit(0)));
